/**
 * Siddon's exact path through a voxel grid, on grids small enough to follow by hand (geometry,
 * common practice, no source): the pieces a ray is cut into, the voxel each lies in, in order.
 */
import { describe, expect, it } from 'vitest';
import { traceRay, type Vec3 } from '../../src/geometry/index.js';
import type { CtVolume } from '../../src/model/index.js';
import { sampledVolume } from '../helpers/model-ct.js';

/** A 4 × 4 × 1 grid of 10 mm voxels, the first voxel centred at (5, 5, 0): voxel (i, j) spans x ∈ [10i, 10i + 10), y ∈ [10j, 10j + 10). */
const grid: CtVolume = sampledVolume({ columns: 4, rows: 4, slices: 1, spacingMm: [10, 10, 10], originMm: [5, 5, 0], hu: () => 0 });

function pieces(from: Vec3, to: Vec3) {
  const out: { voxel: number; startMm: number; lengthMm: number }[] = [];
  traceRay(grid, from, to, (voxel, startMm, lengthMm) => out.push({ voxel, startMm, lengthMm }));
  return out;
}

describe('traceRay', () => {
  it('a ray along x through the second row: four pieces of 10 mm, voxels 4 to 7, starting where it enters the grid', () => {
    const p = pieces([-20, 15, 0], [60, 15, 0]);
    expect(p.map((x) => x.voxel)).toEqual([4, 5, 6, 7]);
    p.forEach((x, k) => {
      expect(x.startMm).toBeCloseTo(20 + 10 * k, 9);
      expect(x.lengthMm).toBeCloseTo(10, 9);
    });
  });
  it('the diagonal from corner to corner: four pieces of 10√2 mm through the diagonal voxels (a corner crossing is one crossing)', () => {
    const p = pieces([0, 0, 0], [40, 40, 0]).filter((x) => x.lengthMm > 1e-9);
    expect(p.map((x) => x.voxel)).toEqual([0, 5, 10, 15]);
    for (const x of p) expect(x.lengthMm).toBeCloseTo(10 * Math.SQRT2, 9);
  });
  it('a slanted ray: the pieces add up to its length inside the grid, and each lies in the voxel its midpoint falls in', () => {
    const from: Vec3 = [2, 3, 0];
    const to: Vec3 = [37, 29, 0];
    const length = Math.hypot(35, 26);
    const p = pieces(from, to);
    expect(p.reduce((s, x) => s + x.lengthMm, 0)).toBeCloseTo(length, 9);
    for (const x of p) {
      const t = (x.startMm + x.lengthMm / 2) / length;
      const [mx, my] = [from[0] + t * 35, from[1] + t * 26];
      expect(x.voxel).toBe(Math.floor(my / 10) * 4 + Math.floor(mx / 10));
    }
  });
  it('visits nothing for a ray that misses the grid', () => {
    expect(pieces([-10, 50, 0], [50, 60, 0])).toEqual([]);
  });
});
