/**
 * Heterogeneity corrections, by their definitions (common practice, no source): the TPR ratio
 * CF = TPR(d_eff, r)/TPR(d, r); Batho's power law in its generalized form, 1 in water. Each returns
 * the notes of the lookups it rests on with its value.
 */
import { describe, expect, it } from 'vitest';
import { bathoCorrection, tprAt, tprRatioCorrection } from '../../src/physics/index.js';
import { beam, DEMO_MANIFEST, machine } from '../helpers/machines.js';

const b6 = beam(machine(DEMO_MANIFEST), '6X');

describe('heterogeneity corrections', () => {
  it('the TPR ratio is TPR at the radiological depth over TPR at the geometric depth', () => {
    const r = tprRatioCorrection(b6, 10, 7, 10);
    expect(r.value).toBeCloseTo(tprAt(b6, 7, 10, []) / tprAt(b6, 10, 10, []), 14);
    expect(r.value).toBeGreaterThan(1); // less material upstream: more dose
    expect(tprRatioCorrection(b6, 10, 10, 10).value).toBe(1);
    expect(r.lookups).toEqual([]);
  });
  it("Batho's law is 1 in water and below a low-density slab agrees with its two-layer form", () => {
    expect(bathoCorrection(b6, [{ distanceToPointCm: 10, density: 1 }], 10).value).toBeCloseTo(1, 14);
    // Water from 10 cm above the point, lung (0.3) from 7 to 4 cm above it, then water: CF = TPR(7)^(0.3 − 1) · TPR(4)^(1 − 0.3).
    const layers = [
      { distanceToPointCm: 10, density: 1 },
      { distanceToPointCm: 7, density: 0.3 },
      { distanceToPointCm: 4, density: 1 },
    ];
    const expected = tprAt(b6, 7, 10, []) ** (0.3 - 1) * tprAt(b6, 4, 10, []) ** (1 - 0.3);
    expect(bathoCorrection(b6, layers, 10).value).toBeCloseTo(expected, 12);
  });
  it('returns a refused lookup with its value rather than a number from outside the table', () => {
    const r = tprRatioCorrection(b6, 10, 500, 10);
    expect(Number.isNaN(r.value)).toBe(true);
    expect(r.lookups.some((n) => n.kind === 'out-of-range')).toBe(true);
  });
});
