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

export function boxVolume(spec: BoxSpec): CtVolume {
  const n = (2 * spec.halfMm) / VOXEL_MM + 3;
  const origin = -spec.halfMm - VOXEL_MM;
  const hu = new Int16Array(n * n * n);
  for (let k = 0; k < n; k++)
    for (let j = 0; j < n; j++)
      for (let i = 0; i < n; i++) {
        const [x, y, z] = [origin + i * VOXEL_MM, origin + j * VOXEL_MM, origin + k * VOXEL_MM];
        const inside = Math.max(Math.abs(x), Math.abs(y), Math.abs(z)) <= spec.halfMm;
        const slab = spec.slabs?.find((s) => y >= s.fromMm && y <= s.toMm);
        hu[(k * n + j) * n + i] = !inside ? -1000 : slab ? slab.hu : 0;
      }
  return {
    frameOfReferenceUid: '1.2.3.9',
    seriesInstanceUid: '1.2.3.10',
    columns: n,
    rows: n,
    slices: n,
    originMm: [origin, origin, origin],
    rowDirection: [1, 0, 0],
    columnDirection: [0, 1, 0],
    normal: [0, 0, 1],
    columnSpacingMm: VOXEL_MM,
    rowSpacingMm: VOXEL_MM,
    sliceSpacingMm: VOXEL_MM,
    hu,
  };
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
