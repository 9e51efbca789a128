/**
 * Where a ray enters the body drawn by the EXTERNAL contours: found exactly on the contour (even-odd
 * rule for holes), each contour a prism half a slice thick to either side. Expectations by hand
 * from the contours' geometry (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { bodySurface } from '../../src/geometry/body-surface.js';
import type { CtVolume, Structure } from '../../src/model/index.js';
import { sampledVolume } from '../helpers/model-ct.js';

/** An axial CT: 11 slices 3 mm apart from z = 0; only its geometry matters here. */
const volume: CtVolume = sampledVolume({ columns: 2, rows: 2, slices: 11, spacingMm: [1, 1, 3], originMm: [-250, -250, 0], hu: () => 0 });
const square = (half: number, z: number): [number, number, number][] => [
  [-half, -half, z],
  [half, -half, z],
  [half, half, z],
  [-half, half, z],
];
const body = (slices: number[], holeHalf?: number): Structure => ({
  number: 1,
  name: 'BODY',
  type: 'EXTERNAL',
  contours: slices.flatMap((k) => [
    { geometricType: 'CLOSED_PLANAR', pointsMm: square(100, 3 * k) },
    ...(holeHalf ? [{ geometricType: 'CLOSED_PLANAR', pointsMm: square(holeHalf, 3 * k) }] : []),
  ]),
});
const all = [0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10];

describe('the body surface', () => {
  it('an anterior ray to the centre enters 100 mm before it (a 200 mm square body)', () => {
    expect(bodySurface(volume, body(all)).entryMm([0, -1000, 15], [0, 0, 15])).toBeCloseTo(900, 9);
  });
  it('an oblique ray enters where it crosses the front face: by similar triangles', () => {
    // From (300, -1000) to (0, 0): it reaches y = -100 after 9/10 of its length.
    const length = Math.hypot(300, 1000);
    expect(bodySurface(volume, body(all)).entryMm([300, -1000, 15], [0, 0, 15])).toBeCloseTo(0.9 * length, 9);
  });
  it('a ray that passes beside the body never enters it', () => {
    expect(bodySurface(volume, body(all)).entryMm([150, -1000, 15], [150, 1000, 15])).toBeUndefined();
  });
  it("an inner contour is a hole: a ray starting in it enters the body at the hole's edge", () => {
    expect(bodySurface(volume, body(all, 40)).entryMm([0, 0, 15], [0, -1000, 15])).toBeCloseTo(40, 9);
    expect(bodySurface(volume, body(all, 40)).entryMm([0, -1000, 15], [0, 0, 15])).toBeCloseTo(900, 9);
  });
  it('contours reach half a slice beyond their plane: a ray along z from the head enters at z = 16.5 mm for contours on z = 0…15', () => {
    expect(bodySurface(volume, body([0, 1, 2, 3, 4, 5])).entryMm([0, 0, 30], [0, 0, -2])).toBeCloseTo(30 - 16.5, 9);
  });
  it('open contours and a zero-length ray give no entry', () => {
    const open: Structure = { ...body(all), contours: body(all).contours.map((c) => ({ ...c, geometricType: 'OPEN_PLANAR' })) };
    expect(bodySurface(volume, open).entryMm([0, -1000, 15], [0, 0, 15])).toBeUndefined();
    expect(bodySurface(volume, body(all)).entryMm([0, 0, 15], [0, 0, 15])).toBeUndefined();
  });
});
