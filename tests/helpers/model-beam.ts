/**
 * Beam models built directly from numbers (no files, no DICOM): for physics and geometry unit tests
 * whose expectations are computed by hand from the same numbers.
 */
import { makeTableLookup } from '../../src/beamdata/table-lookup.js';
import type { Beam, ControlPoint, ElectronBeamModel, PhotonBeamModel, TableLookup } from '../../src/model/index.js';

const axis = (name: string, values: readonly number[]) => ({ name, unit: 'cm', values: Float64Array.from(values) });

/** A grid table: `f(row, column)` sampled at every node, interpolated bilinearly. */
export function grid(name: string, rows: readonly number[], columns: readonly number[], f: (row: number, column: number) => number): TableLookup {
  return makeTableLookup({
    name,
    rows: axis('depth', rows),
    columns: axis('fieldSide', columns),
    values: Float64Array.from(rows.flatMap((r) => columns.map((c) => f(r, c)))),
    interpolation: 'bilinear',
  });
}

/** A profile: `f(row)` sampled at every node, interpolated linearly. */
export function profile(name: string, rows: readonly number[], f: (row: number) => number): TableLookup {
  return makeTableLookup({ name, rows: axis('fieldSide', rows), values: Float64Array.from(rows.map(f)), interpolation: 'bilinear' });
}

export const DEPTHS_CM = [0, 0.5, 1, 1.5, 2, 3, 5, 7, 10, 15, 20, 25, 30];
export const SIDES_CM = [2, 4, 6, 8, 10, 12, 15, 20, 25, 30, 40];

export interface PhotonNumbers {
  readonly d0Cm?: number;
  readonly doseCGyPerMu?: number;
  readonly sc?: (sideCm: number) => number;
  readonly sp?: (sideCm: number) => number;
  /** TPR normalised at d0, by depth and side at depth. */
  readonly tpr?: (depthCm: number, sideCm: number) => number;
  /** PDD in percent at `pddSsdCm`, by depth and side at the surface. */
  readonly pdd?: (depthCm: number, sideCm: number) => number;
  readonly pddSsdCm?: number;
  readonly pddNormalizationDepthCm?: number;
}

/** A photon beam whose factors are the given functions (tables sampled on DEPTHS_CM × SIDES_CM). */
export function photonBeam(n: PhotonNumbers): PhotonBeamModel {
  const d0Cm = n.d0Cm ?? 1.5;
  return {
    id: 'T6',
    radiationType: 'PHOTON',
    nominalEnergyMV: 6,
    fff: false,
    calibration: { ssd0Cm: 100, d0Cm, doseCGyPerMu: n.doseCGyPerMu ?? 1, dmaxCm: 1.5, referenceFieldAt: 'surface', referenceFieldCm: 10 },
    sc: profile('T6 sc', SIDES_CM, n.sc ?? (() => 1)),
    sp: profile('T6 sp', SIDES_CM, n.sp ?? (() => 1)),
    ...(n.tpr ? { tpr: Object.assign(grid('T6 tpr', DEPTHS_CM, SIDES_CM, n.tpr), { normalizationDepthCm: d0Cm, kind: 'TPR' as const }) } : {}),
    ...(n.pdd
      ? {
          pdd: Object.assign(grid('T6 pdd', DEPTHS_CM, SIDES_CM, n.pdd), {
            ssdCm: n.pddSsdCm ?? 100,
            normalizationDepthCm: n.pddNormalizationDepthCm ?? d0Cm,
          }),
        }
      : {}),
    wedges: [],
    trays: [],
  };
}

export interface ElectronNumbers {
  readonly pdd: (depthCm: number, sideCm: number) => number;
  readonly outputFactor?: (sideCm: number) => number;
  readonly effectiveSsdCm?: number;
  readonly doseCGyPerMu?: number;
}

/** A 9 MeV electron beam with one 10 × 10 applicator, its PDD at SSD 100 the given function. */
export function electronBeam(n: ElectronNumbers): ElectronBeamModel {
  const depths = [0, 0.5, 1, 1.5, 2, 2.5, 3, 3.5, 4, 4.5, 5, 6];
  const sides = [4, 6, 8, 10];
  return {
    id: 'T9E',
    radiationType: 'ELECTRON',
    nominalEnergyMeV: 9,
    calibration: { ssd0Cm: 100, d0Cm: 2, doseCGyPerMu: n.doseCGyPerMu ?? 1, referenceApplicator: 'A10' },
    pdd: Object.assign(grid('T9E pdd', depths, sides, n.pdd), { ssdCm: 100 }),
    applicators: [
      { id: 'A10', sideCm: 10, outputFactor: profile('T9E A10 output', sides, n.outputFactor ?? (() => 1)), effectiveSsdCm: n.effectiveSsdCm ?? 90 },
    ],
  };
}

/** A leaf bank: MLCX (leaves move along X) or MLCY, `pairs` leaves `widthMm` wide centred on the axis. */
export interface ModelMlc {
  readonly type?: 'MLCX' | 'MLCY';
  readonly pairs: number;
  readonly widthMm: number;
}

/** A photon beam's model as the DICOM reader gives it: jaws (both unless said), and a leaf bank when given. */
export function modelBeam(mlc?: ModelMlc, jaws = { x: true, y: true }): Beam {
  return {
    number: 1,
    radiationType: 'PHOTON',
    beamType: 'STATIC',
    wedges: [],
    compensators: [],
    bolusRoiNumbers: [],
    blocks: [],
    applicators: [],
    doseVerification: [],
    controlPoints: [],
    limitingDevices: [
      ...(jaws.x ? [{ type: 'ASYMX' as const, numberOfPairs: 1 }] : []),
      ...(jaws.y ? [{ type: 'ASYMY' as const, numberOfPairs: 1 }] : []),
      ...(mlc
        ? [
            {
              type: mlc.type ?? ('MLCX' as const),
              numberOfPairs: mlc.pairs,
              leafBoundariesMm: Array.from({ length: mlc.pairs + 1 }, (_, i) => (i - mlc.pairs / 2) * mlc.widthMm),
            },
          ]
        : []),
    ],
  };
}

/**
 * A control point at gantry, collimator and couch 0 with jaws x, y (mm; undefined: no jaws on that
 * axis) and, optionally, leaf positions (bank A then bank B): MLCX unless given with their type.
 */
export function modelControlPoint(
  x: [number, number] | undefined,
  y: [number, number] | undefined,
  leaves?: number[] | { type: 'MLCX' | 'MLCY'; positionsMm: number[] },
): ControlPoint {
  const bank = Array.isArray(leaves) ? { type: 'MLCX' as const, positionsMm: leaves } : leaves;
  return {
    index: 0,
    gantryAngleDeg: 0,
    collimatorAngleDeg: 0,
    couchAngleDeg: 0,
    cumulativeMetersetWeight: 0,
    wedgePositions: [],
    doseReferenceCoefficients: [],
    devices: [
      ...(x ? [{ type: 'ASYMX' as const, positionsMm: x }] : []),
      ...(y ? [{ type: 'ASYMY' as const, positionsMm: y }] : []),
      ...(bank ? [bank] : []),
    ],
  };
}

/** A control point of angles only (no devices), the isocenter at `iso`: for frames and depths. */
export function anglesControlPoint(gantry: number, collimator = 0, couch = 0, iso: [number, number, number] = [0, 0, 0]): ControlPoint {
  return {
    ...modelControlPoint(undefined, undefined),
    gantryAngleDeg: gantry,
    collimatorAngleDeg: collimator,
    couchAngleDeg: couch,
    isocenterPatientMm: iso,
  };
}
