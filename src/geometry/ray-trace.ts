import type { CtVolume } from '../model/index.js';
import type { Vec3 } from './vector.js';

/**
 * The exact path of a ray through the voxel grid (Siddon 1985, in the incremental form of Jacobs et
 * al. 1998): the ray from `fromMm` to `toMm` (patient coordinates) is cut at every voxel boundary it
 * crosses and `visit` receives each piece in order: the voxel's index in `hu`, the distance from
 * `fromMm` where the piece starts, and its length (mm). Pieces outside the volume are not visited.
 * Works in voxel-index space (voxel i spans [i, i + 1)), so the three spacings may differ.
 */
export function traceRay(volume: CtVolume, fromMm: Vec3, toMm: Vec3, visit: (voxel: number, startMm: number, lengthMm: number) => void): void {
  const { columns: nx, rows: ny, slices: nz } = volume;
  const toIndex = (p: Vec3): Vec3 => {
    const d: Vec3 = [p[0] - volume.originMm[0], p[1] - volume.originMm[1], p[2] - volume.originMm[2]];
    // +0.5: Image Position is the centre of the first voxel, whose boundary is half a voxel before it.
    return [
      (d[0] * volume.rowDirection[0] + d[1] * volume.rowDirection[1] + d[2] * volume.rowDirection[2]) / volume.columnSpacingMm + 0.5,
      (d[0] * volume.columnDirection[0] + d[1] * volume.columnDirection[1] + d[2] * volume.columnDirection[2]) / volume.rowSpacingMm + 0.5,
      (d[0] * volume.normal[0] + d[1] * volume.normal[1] + d[2] * volume.normal[2]) / volume.sliceSpacingMm + 0.5,
    ];
  };
  const a = toIndex(fromMm);
  const b = toIndex(toMm);
  const length = Math.hypot(toMm[0] - fromMm[0], toMm[1] - fromMm[1], toMm[2] - fromMm[2]);
  if (length === 0) return;
  const dir = [b[0] - a[0], b[1] - a[1], b[2] - a[2]];
  const size = [nx, ny, nz];
  // Clip the parameter t ∈ [0, 1] to the volume's box.
  let t0 = 0;
  let t1 = 1;
  for (let k = 0; k < 3; k++) {
    if (dir[k] === 0) {
      if (a[k]! < 0 || a[k]! >= size[k]!) return;
      continue;
    }
    let ta = (0 - a[k]!) / dir[k]!;
    let tb = (size[k]! - a[k]!) / dir[k]!;
    if (ta > tb) [ta, tb] = [tb, ta];
    t0 = Math.max(t0, ta);
    t1 = Math.min(t1, tb);
  }
  if (t0 >= t1) return;
  const idx = [0, 0, 0];
  const step = [0, 0, 0];
  const tNext = [Infinity, Infinity, Infinity];
  const tDelta = [Infinity, Infinity, Infinity];
  const tMid = t0 + 1e-12 * (t1 - t0);
  for (let k = 0; k < 3; k++) {
    const p = a[k]! + tMid * dir[k]!;
    idx[k] = Math.min(size[k]! - 1, Math.max(0, Math.floor(p)));
    if (dir[k]! > 0) {
      step[k] = 1;
      tNext[k] = (idx[k]! + 1 - a[k]!) / dir[k]!;
      tDelta[k] = 1 / dir[k]!;
    } else if (dir[k]! < 0) {
      step[k] = -1;
      tNext[k] = (idx[k]! - a[k]!) / dir[k]!;
      tDelta[k] = -1 / dir[k]!;
    }
  }
  let t = t0;
  while (t < t1) {
    const k = tNext[0]! <= tNext[1]! ? (tNext[0]! <= tNext[2]! ? 0 : 2) : tNext[1]! <= tNext[2]! ? 1 : 2;
    const tEnd = Math.min(tNext[k]!, t1);
    if (tEnd > t) visit(idx[0]! + nx * (idx[1]! + ny * idx[2]!), t * length, (tEnd - t) * length);
    t = tEnd;
    idx[k] = idx[k]! + step[k]!;
    tNext[k] = tNext[k]! + tDelta[k]!;
    if (idx[k]! < 0 || idx[k]! >= size[k]!) break;
  }
}
