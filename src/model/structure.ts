/** One ROI of an RT Structure Set, with its contours in patient coordinates (mm). */
export interface Structure {
  readonly number: number;
  readonly name: string;
  /** RT ROI Interpreted Type: EXTERNAL marks the body. */
  readonly type?: string;
  readonly frameOfReferenceUid?: string;
  readonly contours: readonly {
    readonly geometricType: string;
    /** x, y, z triples. */
    readonly pointsMm: readonly (readonly [number, number, number])[];
  }[];
}

export interface StructureSet {
  readonly file: string;
  readonly sopInstanceUid: string;
  readonly label?: string;
  readonly structures: readonly Structure[];
}
