/**
 * Heterogeneity corrections, by their definitions (common practice, no source): the TPR ratio
 * CF = TPR(d_eff, r)/TPR(d, r); Batho's power law in its generalized form, 1 in water, defined with a
 * ratio normalised at dmax (TMR), so independent of the table's own normalisation. Each returns
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
  it("Batho's law does not depend on the table's normalisation: a point in lung (ρ 0.25 from 5 to 12 cm) gets the same factor with d0 = 1.5 and d0 = 10 cm", () => {
    // The same beam with its TPR normalised at 10 cm (d0 = 10 cm): TPR10(d) = TMR(d)/TMR(10).
    const at10 = { ...b6, calibration: { ...b6.calibration, d0Cm: 10 } };
    expect(tprAt(at10, 7, 10, [])).toBeCloseTo(tprAt(b6, 7, 10, []) / tprAt(b6, 10, 10, []), 12);
    const layers = [
      { distanceToPointCm: 12, density: 1 },
      { distanceToPointCm: 7, density: 0.25 },
    ];
    // The law with TMR (normalised at dmax = 1.5 cm): CF = TMR(7)^(0.25 − 1).
    const withTmr = tprAt(b6, 7, 10, []) ** (0.25 - 1);
    expect(withTmr).toBeGreaterThan(1.1);
    expect(bathoCorrection(b6, layers, 10).value).toBeCloseTo(withTmr, 12);
    expect(bathoCorrection(at10, layers, 10).value).toBeCloseTo(withTmr, 9);
  });
  it('returns a refused lookup with its value rather than a number from outside the table', () => {
    const r = tprRatioCorrection(b6, 10, 500, 10);
    expect(Number.isNaN(r.value)).toBe(true);
    expect(r.lookups.some((n) => n.kind === 'out-of-range')).toBe(true);
  });
});
