/**
 * The beam data's own consistency: the reference field's factors, and a measured PDD table against a
 * measured TPR table through the exact conversion (TPR = PDD/100 · ((f + d)/(f + d0))² · Sp(rd0)/Sp(rd),
 * TG-71 / Khan, read).
 */
import { describe, expect, it } from 'vitest';
import { pddTprAgreement, referenceFieldFactors } from '../../src/physics/beam-data-consistency.js';
import { photonBeam } from '../helpers/model-beam.js';

const sp = (s: number) => 0.95 + 0.005 * s;
const tpr = (d: number, s: number) => Math.exp(-0.045 * (d - 1.5)) * (1 + 0.0004 * s * Math.max(0, d - 1.5));
const f = 100;
/** PDD written from the TPR by the published relation, so the two tables agree by construction. */
const pddFromTpr = (scale: number) => (d: number, r: number) => {
  const rd = (r * (f + d)) / f;
  const rd0 = (r * (f + 1.5)) / f;
  return scale * 100 * tpr(d, rd) * ((f + 1.5) / (f + d)) ** 2 * (sp(rd) / sp(rd0));
};

describe('the reference field', () => {
  it('10 cm at the surface is 10.15 cm at d0 = 1.5 cm and 10 cm at the isocenter plane (SAD 100, inverse square)', () => {
    const b = photonBeam({ sc: (s) => 1 + 0.01 * (s - 10), sp: (s) => 1 + 0.01 * (s - 10) });
    const r = referenceFieldFactors(b, 100);
    expect(r.spCm).toBeCloseTo(10.15, 12);
    expect(r.scCm).toBeCloseTo(10, 12);
    expect(r.sc).toBeCloseTo(1, 12);
    // Sp normalised at 10 × 10 rather than 10.15: the 0.15 % mismatch shows.
    expect(r.sp).toBeCloseTo(1.0015, 12);
  });
  it('defined at the normalisation depth, the reference field is used as given there', () => {
    const b = photonBeam({ sp: (s) => 1 + 0.01 * (s - 10) });
    const r = referenceFieldFactors({ ...b, calibration: { ...b.calibration, referenceFieldAt: 'normalization-depth' } }, 100);
    expect(r.spCm).toBe(10);
    expect(r.sp).toBeCloseTo(1, 12);
  });
});

describe('PDD against TPR', () => {
  it('is undefined unless both were measured', () => {
    expect(pddTprAgreement(photonBeam({ sp, tpr }))).toBeUndefined();
  });
  it('agrees within interpolation where the PDD was written from the TPR; cells above dmax and outside the tables are left out', () => {
    const r = pddTprAgreement(photonBeam({ sp, tpr, pdd: pddFromTpr(1) }))!;
    expect(r.differences.length).toBeGreaterThan(50);
    expect(r.differences.every((x) => x.depthCm >= 1.5)).toBe(true);
    expect(Math.max(...r.differences.map((x) => Math.abs(x.differencePercent)))).toBeLessThan(0.3);
    expect(r.skipped).toBeGreaterThan(0); // the largest surface fields project beyond the TPR table's sides
  });
  it('shows a PDD table 2 % high as +2 % in every cell', () => {
    const r = pddTprAgreement(photonBeam({ sp, tpr, pdd: pddFromTpr(1.02) }))!;
    for (const x of r.differences) expect(x.differencePercent).toBeGreaterThan(1.6);
    const mean = r.differences.reduce((s, x) => s + x.differencePercent, 0) / r.differences.length;
    expect(mean).toBeCloseTo(2, 1);
  });
});
