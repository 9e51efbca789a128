/**
 * The dosimetric functions of a beam at any geometry, on beams built from numbers (no files), each
 * expectation computed here from the published relation it rests on.
 */
import { describe, expect, it } from 'vitest';
import type { LookupLog, PhotonBeamModel } from '../../src/model/index.js';
import { pddAt, scAt, spAt, tprAt, tprAtDepth } from '../../src/physics/beam-factors.js';
import { photonBeam, profile, SIDES_CM } from '../helpers/model-beam.js';

/** Smooth, field- and depth-dependent factors, so no relation holds by accident of constant tables. */
const sc = (s: number) => 0.94 + 0.006 * s - 0.00008 * s * s;
const sp = (s: number) => 0.95 + 0.005 * s - 0.00006 * s * s;
const tpr = (d: number, s: number) => Math.exp(-0.045 * (d - 1.5)) * (1 + 0.002 * s * Math.max(0, d - 1.5) * 0.1);

describe('Sc, Sp', () => {
  const b = photonBeam({ sc, sp, tpr });
  it('Sc of a rectangle is Sc of its 4A/P square without a collimator-exchange constant (10 × 20 → 13.33 cm, BJR Supplement 25 formula)', () => {
    expect(scAt(b, 10, 20, [])).toBeCloseTo(profile('x', SIDES_CM, sc).at(40 / 3, 0, []), 12);
  });
  it('with a collimator-exchange constant k the upper jaws (Y) weigh more: (1 + k)XY/(kX + Y) (from memory)', () => {
    const k = 1.5;
    const withK: PhotonBeamModel = { ...b, collimatorExchangeK: k };
    const side = ((1 + k) * 10 * 20) / (k * 10 + 20);
    expect(scAt(withK, 10, 20, [])).toBeCloseTo(profile('x', SIDES_CM, sc).at(side, 0, []), 12);
    expect(scAt(withK, 10, 20, [])).not.toBeCloseTo(scAt(withK, 20, 10, []), 4);
  });
  it('Sp = Scp / Sc when only Scp was measured (TG-71 relation, read)', () => {
    const { sp: _sp, ...rest } = b;
    const scpOnly: PhotonBeamModel = { ...rest, scp: profile('scp', SIDES_CM, (s) => sc(s) * sp(s)) };
    // At the table's nodes (between them each table is interpolated on its own).
    for (const s of [4, 10, 15, 30]) expect(spAt(scpOnly, s, [])).toBeCloseTo(sp(s), 12);
  });
  it('Sp measured at another depth is carried to d0 through the TPR; the reference field keeps Sp = 1 (identity)', () => {
    const atDepth10 = photonBeam({ sc, tpr, sp: (s) => sp(s) / sp(10 * 1.015) });
    const moved: PhotonBeamModel = { ...atDepth10, spMeasuredAtDepthCm: 10 };
    // The reference field at d0: 10 cm at the surface projected to SSD0 + d0 = 101.5 cm.
    const ref = 10 * 1.015;
    expect(spAt(moved, ref, [])).toBeCloseTo(atDepth10.sp!.at(ref, 0, []), 12);
    expect(spAt(moved, ref, [])).toBeCloseTo(1, 4);
    // Sp(r, d0) = Sp(r, dm)·TPR(dm, ref)/TPR(dm, r), written out here.
    const expected = (atDepth10.sp!.at(6, 0, []) * tprAt(atDepth10, 10, ref, [])) / tprAt(atDepth10, 10, 6, []);
    expect(spAt(moved, 6, [])).toBeCloseTo(expected, 12);
  });
});

describe('TPR and PDD from each other', () => {
  it('TPR derived from a PDD table follows TPR = PDD/100 · ((f + d)/(f + d0))² · Sp(rd0)/Sp(rd) (TG-71 / Khan, read)', () => {
    // Khan's SSD example: PDD 65.1 % at 10 cm (read); any PDD surface works, here flat in field size.
    const b = photonBeam({ sc, sp, pdd: (d) => (d === 10 ? 65.1 : 100 * Math.exp(-0.0429 * (d - 1.5))) });
    const f = 100;
    const rd = (15 * (f + 10)) / f;
    const rd0 = (15 * (f + 1.5)) / f;
    const expected = 0.651 * ((f + 10) / (f + 1.5)) ** 2 * (sp(rd0) / sp(rd));
    expect(tprAt(b, 10, rd, [])).toBeCloseTo(expected, 3);
  });
  it('a PDD table normalised at dmax is renormalised to 100 % at d0 (identity)', () => {
    const pdd = (d: number, s: number) => 100 * Math.exp(-0.05 * Math.abs(d - 1.5)) * (1 + 0.001 * s);
    const b = photonBeam({ d0Cm: 10, sc, sp, pdd, pddNormalizationDepthCm: 1.5 });
    expect(pddAt(b, 10, 10, 100, [])).toBeCloseTo(100, 10);
    expect(pddAt(b, 5, 10, 100, [])).toBeCloseTo((100 * b.pdd!.at(5, 10, [])) / b.pdd!.at(10, 10, []), 10);
  });
  // Khan's example, from memory: 80 → 100 cm, d 10 cm, dmax 0.5 cm gives F = 1.0434.
  it('with scatter independent of field size, PDD at another SSD is the Mayneord F factor times the PDD', () => {
    const b = photonBeam({ d0Cm: 0.5, tpr: (d) => Math.exp(-0.04 * (d - 0.5)) });
    const f = pddAt(b, 10, 15, 100, []) / pddAt(b, 10, 15, 80, []);
    expect(f).toBeCloseTo(1.0434, 4);
  });
  it('TPR at d0 is 1 for every field, with a TPR table or derived from a PDD table (identity)', () => {
    for (const b of [photonBeam({ sc, sp, tpr }), photonBeam({ sc, sp, pdd: (d) => 100 * Math.exp(-0.045 * (d - 1.5)) })])
      for (const s of [3, 10, 28]) expect(tprAt(b, 1.5, s, [])).toBeCloseTo(1, 10);
  });
  it('a TPR table normalised elsewhere is divided by its value at d0', () => {
    const b = photonBeam({ sc, sp, tpr });
    const atDmax: PhotonBeamModel = { ...b, calibration: { ...b.calibration, d0Cm: 10 } };
    expect(tprAt(atDmax, 20, 12, [])).toBeCloseTo(tpr(20, 12) / tpr(10, 12), 4);
  });
});

describe('tprAtDepth', () => {
  it('equals tprAt at every side, with and without a measured TPR table, normalised at d0 or not', () => {
    const measured = photonBeam({ sc, sp, tpr });
    const elsewhere: PhotonBeamModel = { ...measured, calibration: { ...measured.calibration, d0Cm: 5 } };
    const derived = photonBeam({ sc, sp, pdd: (d, s) => 100 * Math.exp(-0.045 * (d - 1.5)) * (1 + 0.0005 * s * d) });
    for (const b of [measured, elsewhere, derived])
      for (const d of [3, 12.5]) {
        const at = tprAtDepth(b, d, []);
        for (const s of [2.5, 9, 31]) expect(at(s, [])).toBeCloseTo(tprAt(b, d, s, []), 12);
      }
  });
  it('a depth outside the table refuses every side, each lookup noted, exactly as tprAt does', () => {
    const b = photonBeam({ sc, sp, tpr });
    const viaDepth: LookupLog = [];
    const at = tprAtDepth(b, 45, viaDepth);
    const direct: LookupLog = [];
    for (const s of [5, 10, 20]) {
      expect(Number.isNaN(at(s, viaDepth))).toBe(true);
      expect(Number.isNaN(tprAt(b, 45, s, direct))).toBe(true);
    }
    expect(viaDepth).toEqual(direct);
    expect(viaDepth.every((n) => n.kind === 'out-of-range' && n.axis === 'depth')).toBe(true);
  });
});
