/**
 * CT volumes built in memory (no files): a box of water with optional slabs, and the patient CT the
 * check takes, with a linear HU → density table (ρ = 1 + HU/1000) so every expectation follows by hand.
 */
import type { PatientCt } from '../../src/check/patient-ct.js';
import type { CtVolume } from '../../src/model/index.js';

export interface BoxSpec {
  /** Half the box's side (mm); 5 mm voxels centred on the origin, air (−1000 HU) for one voxel around it. */
  readonly halfMm: number;
  /** Slabs across y (anterior–posterior), voxel centres from `fromMm` to `toMm` inclusive, at `hu`. */
  readonly slabs?: readonly { readonly fromMm: number; readonly toMm: number; readonly hu: number }[];
}

export const VOXEL_MM = 5;

/** A CT volume sampled from HU at each voxel centre (patient mm), stored as a 12-bit scanner stores it (−1024 to 3071 HU). */
export interface SampledSpec {
  readonly columns: number;
  readonly rows: number;
  readonly slices: number;
  /** Column (x), row (y) and slice (z) spacing, mm. */
  readonly spacingMm: readonly [number, number, number];
  /** Centre of the first voxel. */
  readonly originMm: readonly [number, number, number];
  readonly hu: (x: number, y: number, z: number) => number;
}

export function sampledVolume(s: SampledSpec): CtVolume {
  const [dx, dy, dz] = s.spacingMm;
  const [ox, oy, oz] = s.originMm;
  const hu = new Int16Array(s.columns * s.rows * s.slices);
  for (let k = 0; k < s.slices; k++)
    for (let j = 0; j < s.rows; j++)
      for (let i = 0; i < s.columns; i++)
        hu[(k * s.rows + j) * s.columns + i] = Math.max(-1024, Math.min(3071, Math.round(s.hu(ox + i * dx, oy + j * dy, oz + k * dz))));
  return {
    frameOfReferenceUid: '1.2.3.9',
    seriesInstanceUid: '1.2.3.10',
    columns: s.columns,
    rows: s.rows,
    slices: s.slices,
    originMm: [ox, oy, oz],
    rowDirection: [1, 0, 0],
    columnDirection: [0, 1, 0],
    normal: [0, 0, 1],
    columnSpacingMm: dx,
    rowSpacingMm: dy,
    sliceSpacingMm: dz,
    hu,
  };
}

export function boxVolume(spec: BoxSpec): CtVolume {
  const n = (2 * spec.halfMm) / VOXEL_MM + 3;
  const origin = -spec.halfMm - VOXEL_MM;
  return sampledVolume({
    columns: n,
    rows: n,
    slices: n,
    spacingMm: [VOXEL_MM, VOXEL_MM, VOXEL_MM],
    originMm: [origin, origin, origin],
    hu: (x, y, z) => {
      if (Math.max(Math.abs(x), Math.abs(y), Math.abs(z)) > spec.halfMm) return -1000;
      return spec.slabs?.find((s) => y >= s.fromMm && y <= s.toMm)?.hu ?? 0;
    },
  });
}

export function boxCt(spec: BoxSpec): PatientCt {
  return {
    volume: boxVolume(spec),
    density: (h) => Math.max(0, 1 + h / 1000),
    densityTable: 'linear (test)',
    bodyThresholdHu: -400,
    bodySource: 'HU >= -400',
  };
}
