import { describe, expect, it } from 'vitest';
import { doseAtPointGy } from '../../src/geometry/dose-at-point.js';
import type { DoseGrid } from '../../src/model/index.js';

/** A 3 × 2 × 3 grid at 10 mm spacing, frames at 0, 10 and 30 mm (unevenly), dose = x/10 + y/100 + z/1000 Gy at voxel centres. */
function grid(frames: number[]): DoseGrid {
  const doseGy = new Float32Array(3 * 2 * frames.length);
  frames.forEach((z, k) => {
    for (let j = 0; j < 2; j++) for (let i = 0; i < 3; i++) doseGy[(k * 2 + j) * 3 + i] = (10 * i) / 10 + (10 * j) / 100 + z / 1000;
  });
  return {
    file: 'g.dcm',
    frameOfReferenceUid: '2.25.1',
    summationType: 'PLAN',
    units: 'GY',
    type: 'PHYSICAL',
    columns: 3,
    rows: 2,
    originMm: [0, 0, 0],
    rowDirection: [1, 0, 0],
    columnDirection: [0, 1, 0],
    normal: [0, 0, 1],
    columnSpacingMm: 10,
    rowSpacingMm: 10,
    frameOffsetsMm: frames,
    doseGy,
  };
}

describe('the dose grid at a point', () => {
  it('interpolates trilinearly, exact for a dose linear in x, y and z, across unevenly spaced frames', () => {
    // By hand: at (15, 5, 20) mm the dose is 1.5 + 0.05 + 0.02 = 1.57 Gy.
    expect(doseAtPointGy(grid([0, 10, 30]), [15, 5, 20])).toBeCloseTo(1.57, 6);
    expect(doseAtPointGy(grid([0, 10, 30]), [20, 10, 30])).toBeCloseTo(2.13, 6);
  });
  it('takes frames given in descending order as well, and gives nothing outside the grid', () => {
    expect(doseAtPointGy(grid([30, 10, 0]), [15, 5, 20])).toBeCloseTo(1.57, 6);
    expect(doseAtPointGy(grid([0, 10, 30]), [25, 5, 20])).toBeUndefined();
    expect(doseAtPointGy(grid([0, 10, 30]), [5, 5, 31])).toBeUndefined();
  });
});
