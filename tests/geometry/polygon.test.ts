/**
 * Plane polygons (block and cutout outlines). Check values are elementary geometry worked by hand
 * (common practice, no source): a 40 × 20 mm rectangle, a right triangle, a concave L.
 */
import { describe, expect, it } from 'vitest';
import {
  axisAlignedRectangle,
  insidePolygon,
  type Polygon,
  polygonArea,
  polygonEdgeDistance,
  polygonRayCrossings,
} from '../../src/geometry/index.js';

const rect: Polygon = [
  [-20, -10],
  [20, -10],
  [20, 10],
  [-20, 10],
];
const ell: Polygon = [
  [0, 0],
  [30, 0],
  [30, 10],
  [10, 10],
  [10, 30],
  [0, 30],
];

describe('plane polygons', () => {
  it('area by the shoelace formula, either winding', () => {
    expect(polygonArea(rect)).toBe(800);
    expect(polygonArea([...rect].reverse())).toBe(800);
    expect(polygonArea(ell)).toBe(30 * 10 + 10 * 20);
    expect(
      polygonArea([
        [0, 0],
        [30, 0],
        [0, 40],
      ]),
    ).toBe(600);
  });
  it('inside by the even-odd rule, the concave notch outside', () => {
    expect(insidePolygon(rect, 0, 0)).toBe(true);
    expect(insidePolygon(rect, 25, 0)).toBe(false);
    expect(insidePolygon(ell, 5, 25)).toBe(true);
    expect(insidePolygon(ell, 20, 20)).toBe(false);
  });
  it('distance to the nearest edge, and where a ray crosses the edges', () => {
    expect(polygonEdgeDistance(rect, 0, 0)).toBe(10);
    expect(polygonEdgeDistance(rect, 23, 14)).toBeCloseTo(5, 12); // 3-4-5 from the corner (20, 10)
    expect(polygonRayCrossings(rect, 0, 0, 1, 0)).toEqual([20]);
    expect(polygonRayCrossings(ell, 5, 20, 1, 0)).toEqual([5]);
    expect(polygonRayCrossings(ell, -5, 5, 1, 0)).toEqual([5, 35]);
  });
  it('recognises an axis-aligned rectangle by its corners and nothing else', () => {
    expect(axisAlignedRectangle(rect)).toEqual({ x: 40, y: 20 });
    expect(axisAlignedRectangle(ell)).toBeUndefined();
    expect(
      axisAlignedRectangle([
        [0, 0],
        [10, 1],
        [10, 11],
        [0, 10],
      ]),
    ).toBeUndefined();
  });
});
