/**
 * The clinic's commissioned beam data as the dose engine sees it: tables already loaded, checked and
 * turned into lookups (built once per table by src/beamdata/). Lengths in cm, PDD in percent,
 * everything else a ratio. The engine never reads files.
 */

/** A lookup that went outside a table: clamped to the edge (allowed by the manifest) or refused. */
export interface LookupNote {
  readonly table: string;
  readonly axis: string;
  readonly requested: number;
  readonly used: number;
  readonly kind: 'clamped' | 'out-of-range';
  /** The table's range on that axis, in the axis's unit. */
  readonly range: readonly [number, number];
  readonly unit: string;
}

/** A value with the notes of the table lookups it rests on (clamped or refused), none dropped. */
export interface Looked<T> {
  readonly value: T;
  readonly lookups: readonly LookupNote[];
}

/**
 * Notes gathered inside one calculation; empty in the normal case (no allocation per lookup). Used
 * within physics only: what physics returns carries its notes with its value (`Looked`).
 */
export type LookupLog = LookupNote[];

export interface TableAxis {
  readonly name: string;
  readonly unit: string;
  readonly values: Float64Array;
}

/**
 * A table with its interpolator: `at(row, column)` for grids, `at(row)` for profiles. A value
 * outside the valid range gives NaN and an 'out-of-range' note; a stated clamp gives the edge
 * value and a 'clamped' note.
 */
export interface TableLookup {
  /** e.g. `6X pdd (6x/pdd.csv)`: names the beam, the quantity and the file. */
  readonly name: string;
  readonly rows: TableAxis;
  readonly columns?: TableAxis;
  at(row: number, column: number, log: LookupLog): number;
  /**
   * The table at one row (e.g. one depth) as a function of the column: equal to `at(row, column)`
   * for every column, with the row's interpolation done once (the row's notes are written here,
   * once). For many lookups at one depth, as the sectors of a Clarkson integration make.
   */
  atRow(row: number, log: LookupLog): (column: number, log: LookupLog) => number;
}

export interface PhotonCalibration {
  /** Source-to-surface distance of the normalization (calibration) geometry. */
  readonly ssd0Cm: number;
  /** Normalization depth d0: the point lies at ssd0Cm + d0Cm from the source. */
  readonly d0Cm: number;
  /** D'0: dose per MU at d0 for the reference field in the calibration geometry. */
  readonly doseCGyPerMu: number;
  readonly dmaxCm: number;
  /** Where the 10 x 10 reference field is defined: at the surface or at the normalization point. */
  readonly referenceFieldAt: 'surface' | 'normalization-depth';
  readonly referenceFieldCm: number;
}

export interface WedgeData {
  readonly id: string;
  readonly angleDeg: number;
  /** Wedge factor vs collimator field side (columns) and optionally depth (rows). */
  readonly factor: TableLookup;
  readonly byDepth: boolean;
  /** Wedged / open ratio vs depth (rows) and position toward the heel at the isocenter plane (columns); 1 on axis. */
  readonly profile?: TableLookup;
}

export interface PhotonBeamModel {
  readonly id: string;
  readonly radiationType: 'PHOTON';
  readonly nominalEnergyMV: number;
  readonly fff: boolean;
  readonly calibration: PhotonCalibration;
  /** PDD (percent) vs depth (rows) and field side at the surface (columns), at `ssdCm`, normalized at `normalizationDepthCm`. */
  readonly pdd?: TableLookup & { readonly ssdCm: number; readonly normalizationDepthCm: number };
  /** TPR vs depth (rows) and field side at depth (columns), normalized at `normalizationDepthCm` (TMR when that is dmax). */
  readonly tpr?: TableLookup & { readonly normalizationDepthCm: number; readonly kind: 'TPR' | 'TMR' };
  /** In-air output ratio vs collimator equivalent square at the isocenter plane. */
  readonly sc: TableLookup;
  /** Phantom scatter factor vs field side at d0; or total scatter Scp from which Sp = Scp / Sc. */
  readonly sp?: TableLookup;
  readonly scp?: TableLookup;
  /** Off-axis ratio vs depth (rows) and off-axis distance (columns), at depth or projected to the isocenter plane. */
  readonly oar?: TableLookup & { readonly offAxisAt: 'depth' | 'isocenter-plane' };
  readonly wedges: readonly WedgeData[];
  /** A jaw-swept wedge (DYNAMIC in the plan): factor vs wedge angle in degrees (rows) and field length along the sweep (columns). */
  readonly sweptWedge?: TableLookup;
  /** Off axis along the sweep: wedged / open ratio vs wedge angle in degrees (rows) and position toward the heel at the isocenter plane, cm (columns). */
  readonly sweptWedgeProfile?: TableLookup;
  readonly trays: readonly { readonly id: string; readonly factor: number }[];
  readonly mlcTransmission?: number;
  /** The depth Sp (or Scp) was measured at, when not d0: converted to d0 through the TPR table. */
  readonly spMeasuredAtDepthCm?: number;
  /**
   * The dosimetric leaf gap (mm at the isocenter plane): the rounded leaf ends let radiation through
   * as if each open leaf pair were this much wider. Absent: leaf ends not modelled, and the result says so.
   */
  readonly dosimetricLeafGapMm?: number;
  /** Collimator-exchange constant k for Sc's equivalent square (upper jaw = Y); 1 means none. */
  readonly collimatorExchangeK?: number;
}

export interface ElectronApplicatorData {
  readonly id: string;
  /** The open applicator's field side at the nominal SSD. */
  readonly sideCm: number;
  /** Se vs cutout equivalent square at the nominal SSD, at each field's own dmax. */
  readonly outputFactor: TableLookup;
  /** Effective (virtual) SSD: one value, or vs cutout equivalent square. */
  readonly effectiveSsdCm: number | TableLookup;
}

export interface ElectronBeamModel {
  readonly id: string;
  readonly radiationType: 'ELECTRON';
  readonly nominalEnergyMeV: number;
  readonly calibration: { readonly ssd0Cm: number; readonly d0Cm: number; readonly doseCGyPerMu: number; readonly referenceApplicator: string };
  /** PDD (percent) vs depth (rows) and cutout equivalent square (columns) at `ssdCm`, each column 100 at its own dmax. */
  readonly pdd: TableLookup & { readonly ssdCm: number };
  readonly applicators: readonly ElectronApplicatorData[];
}

export interface MachineModel {
  readonly name: string;
  /** Names a plan may use for this machine (Treatment Machine Name), including `name`. */
  readonly aliases: readonly string[];
  readonly sadCm: number;
  readonly invented: boolean;
  readonly description?: string;
  /** Where a wedge's heel points in the BEAM LIMITING DEVICE frame at Wedge Orientation 0 and 90 degrees. */
  readonly wedgeHeel?: { readonly atOrientation0: '+Y' | '-Y'; readonly atOrientation90: '+X' | '-X' };
  /** What the machine can deliver, when the beam data declare it (cm at the isocenter plane, MU). */
  readonly limits?: {
    readonly maxFieldSideCm: number;
    readonly maxJawPositionCm: number;
    readonly maxLeafPositionCm: number;
    readonly maxMuPerBeam: number;
  };
  readonly version: string;
  readonly beams: readonly PhotonBeamModel[];
  readonly electronBeams: readonly ElectronBeamModel[];
}
