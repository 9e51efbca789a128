import type { DoseGrid } from '../model/index.js';
import type { Vec3 } from './vector.js';

/**
 * The grid's dose at a patient point by trilinear interpolation between the eight surrounding voxel
 * centres (frames may be unevenly spaced); undefined outside the grid.
 */
export function doseAtPointGy(grid: DoseGrid, pointMm: Vec3): number | undefined {
  const d: Vec3 = [pointMm[0] - grid.originMm[0], pointMm[1] - grid.originMm[1], pointMm[2] - grid.originMm[2]];
  const u = (d[0] * grid.rowDirection[0] + d[1] * grid.rowDirection[1] + d[2] * grid.rowDirection[2]) / grid.columnSpacingMm;
  const v = (d[0] * grid.columnDirection[0] + d[1] * grid.columnDirection[1] + d[2] * grid.columnDirection[2]) / grid.rowSpacingMm;
  const w = d[0] * grid.normal[0] + d[1] * grid.normal[1] + d[2] * grid.normal[2];
  const f = grid.frameOffsetsMm;
  const eps = 1e-6;
  if (u < -eps || v < -eps || u > grid.columns - 1 + eps || v > grid.rows - 1 + eps) return undefined;
  const ascending = f.length < 2 || f[1]! > f[0]!;
  const lo = ascending ? f[0]! : f[f.length - 1]!;
  const hi = ascending ? f[f.length - 1]! : f[0]!;
  if (w < lo - eps || w > hi + eps) return undefined;
  let k = 0;
  while (k < f.length - 2 && (ascending ? f[k + 1]! < w : f[k + 1]! > w)) k++;
  const tk = f.length < 2 ? 0 : Math.min(1, Math.max(0, (w - f[k]!) / (f[k + 1]! - f[k]!)));
  const i = Math.min(Math.max(Math.floor(u), 0), Math.max(grid.columns - 2, 0));
  const j = Math.min(Math.max(Math.floor(v), 0), Math.max(grid.rows - 2, 0));
  const ti = grid.columns < 2 ? 0 : Math.min(1, Math.max(0, u - i));
  const tj = grid.rows < 2 ? 0 : Math.min(1, Math.max(0, v - j));
  const plane = grid.columns * grid.rows;
  const at = (ii: number, jj: number, kk: number) =>
    grid.doseGy[Math.min(kk, f.length - 1) * plane + Math.min(jj, grid.rows - 1) * grid.columns + Math.min(ii, grid.columns - 1)]!;
  const lerp = (a: number, b: number, t: number) => a + t * (b - a);
  const c = (kk: number) => lerp(lerp(at(i, j, kk), at(i + 1, j, kk), ti), lerp(at(i, j + 1, kk), at(i + 1, j + 1, kk), ti), tj);
  return lerp(c(k), c(k + 1), tk);
}
