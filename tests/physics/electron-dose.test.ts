/**
 * Electron dose per MU on a beam built from numbers: Se from the published 9 MeV output factors of
 * the 10 × 10 applicator (AAPM TG-71 Table VII, read), a hand-made depth dose, and the
 * effective-SSD inverse square for an air gap.
 */
import { describe, expect, it } from 'vitest';
import type { ElectronPointInput } from '../../src/model/index.js';
import { electronDmaxCm, electronDosePerMu, electronIsodoseDepthCm, electronPddPercent } from '../../src/physics/electron-dose.js';
import { electronBeam } from '../helpers/model-beam.js';

/** TG-71 Table VII, 9 MeV, 10 × 10 applicator, SSD 100 cm (read): field side → Se. */
const TABLE_VII: Readonly<Record<number, number>> = { 4: 0.963, 6: 1.003, 8: 1.003, 10: 1.0 };
/** A depth dose: 90 % at the surface rising to 100 % at 2 cm, falling linearly to a 4 % tail; small fields a little lower. */
const pdd = (d: number, s: number) => (d <= 2 ? 90 + 5 * d : Math.max(4, 100 - 30 * (d - 2))) * (1 - 0.005 * (10 - s));
const beam = electronBeam({ pdd, outputFactor: (s) => TABLE_VII[s]!, effectiveSsdCm: 85, doseCGyPerMu: 1 });
const square = (sideCm: number) => ({ kind: 'equivalent-square' as const, sideCm, method: 'test' });
const at = (input: Partial<ElectronPointInput>) => {
  const r = electronDosePerMu(beam, { applicatorId: 'A10', field: square(10), depthCm: 2, ssdCm: 100, ...input });
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.value;
};

describe('electron dose per MU', () => {
  it("is D'0 · Se · PDD at the nominal SSD: Se 0.963 for a 4 × 4 cutout (Table VII)", () => {
    expect(at({ field: square(4), depthCm: 2 }).dosePerMuCGy).toBeCloseTo(0.963 * (pdd(2, 4) / 100), 12);
  });
  it('a rectangle takes Se and PDD by the square-root rule: 4 × 8 → √(0.963 · 1.003) (rule common practice, no source)', () => {
    const r = at({ field: { kind: 'rectangle', xCm: 4, yCm: 8 }, depthCm: 3 });
    expect(r.dosePerMuCGy).toBeCloseTo(Math.sqrt(0.963 * 1.003) * (Math.sqrt(pdd(3, 4) * pdd(3, 8)) / 100), 12);
    expect(r.fieldSideCm).toBeCloseTo(Math.sqrt(32), 12);
  });
  it('an air gap g falls off by ((SSDeff + d0)/(SSDeff + d0 + g))² (effective-SSD inverse square, equation from memory)', () => {
    const r = at({ ssdCm: 110 });
    expect(r.airGapCm).toBeCloseTo(10, 12);
    expect(r.dosePerMuCGy / at({}).dosePerMuCGy).toBeCloseTo(((85 + 2) / (85 + 2 + 10)) ** 2, 12);
  });
  it('the factors multiply to the dose per MU', () => {
    const r = at({ field: { kind: 'rectangle', xCm: 6, yCm: 10 }, depthCm: 2.5, ssdCm: 105 });
    expect(r.factors.reduce((p, f) => p * f.value, 1)).toBeCloseTo(r.dosePerMuCGy, 14);
  });
  it('refuses an applicator the beam data lack, naming the ones it has', () => {
    const r = electronDosePerMu(beam, { applicatorId: 'A25', field: square(10), depthCm: 2, ssdCm: 100 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ code: 'missing-table', expected: 'A10', found: 'A25' });
  });
  it('refuses a negative depth, a zero cutout and a depth beyond the table, with no dose', () => {
    for (const input of [{ depthCm: -1 }, { field: square(0) }, { depthCm: 9 }]) {
      const r = electronDosePerMu(beam, { applicatorId: 'A10', field: square(10), depthCm: 2, ssdCm: 100, ...input });
      expect(r.ok).toBe(false);
    }
  });
});

describe('depths of the electron depth dose', () => {
  it('dmax is the row of the largest PDD (2 cm here)', () => expect(electronDmaxCm(beam, square(8))).toBe(2));
  it('the 80 % isodose lies where the straight fall-off crosses it: 2 + 20/30 cm for a 10 cm field (by hand)', () => {
    expect(electronIsodoseDepthCm(beam, square(10), 80)).toBeCloseTo(2 + 20 / 30, 9);
  });
  it('no isodose below the tail the table reaches', () => expect(electronIsodoseDepthCm(beam, square(10), 3)).toBeUndefined());
  it('the PDD of a rectangle is the geometric mean of its sides', () => {
    expect(electronPddPercent(beam, { kind: 'rectangle', xCm: 4, yCm: 10 }, 3, [])).toBeCloseTo(Math.sqrt(pdd(3, 4) * pdd(3, 10)), 12);
  });
});
