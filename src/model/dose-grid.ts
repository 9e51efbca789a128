/**
 * A planning system's RT Dose grid, in Gy (Dose Grid Scaling applied), x fastest then y then frame.
 * Frame k lies at originMm + normal·frameOffsetsMm[k]; voxel (i, j) within a frame as for CT.
 */
export interface DoseGrid {
  readonly file: string;
  readonly frameOfReferenceUid: string;
  readonly summationType: string;
  readonly units: string;
  readonly type: string;
  readonly referencedPlanUid?: string;
  /** For a per-beam grid (summation BEAM): the beam it belongs to. */
  readonly referencedBeamNumber?: number;
  readonly columns: number;
  readonly rows: number;
  readonly originMm: readonly [number, number, number];
  readonly rowDirection: readonly [number, number, number];
  readonly columnDirection: readonly [number, number, number];
  readonly normal: readonly [number, number, number];
  readonly columnSpacingMm: number;
  readonly rowSpacingMm: number;
  readonly frameOffsetsMm: readonly number[];
  readonly doseGy: Float32Array;
}
