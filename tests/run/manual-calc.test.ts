/**
 * The manual calculation behind `plumbline calc`: its defaults and refusals (project rules), the
 * dose and MU of one setup the inverse of each other (the TG-71 product, common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { electronCalc, photonCalc } from '../../src/run/manual-calc.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const base = { energy: 6, fff: false, setup: 'SAD' as const, field: { x: 10, y: 10 }, depth: 10 };

describe('the manual calculation', () => {
  it('puts an SAD point at the isocenter (SSD = SAD − depth) and an SSD surface at the SAD, unless an SSD is given', () => {
    const sad = photonCalc(demo, { ...base, mu: 100 });
    expect(sad.ok && [sad.value.input.ssdCm, sad.value.ssdNote]).toEqual([demo.sadCm - 10, 'SAD − depth: the point at the isocenter, none given']);
    const ssd = photonCalc(demo, { ...base, setup: 'SSD', mu: 100 });
    expect(ssd.ok && ssd.value.input.ssdCm).toBe(demo.sadCm);
  });
  it('gives the MU for a dose as the inverse of the dose for those MU', () => {
    const forDose = photonCalc(demo, { ...base, dose: 200 });
    if (!forDose.ok) throw new Error('refused');
    const back = photonCalc(demo, { ...base, mu: forDose.value.mu });
    expect(back.ok && back.value.doseCGy).toBeCloseTo(200, 10);
  });
  it('refuses a depth that puts the surface behind the source, an energy or applicator the data lack', () => {
    expect(photonCalc(demo, { ...base, depth: demo.sadCm + 1, mu: 100 }).ok).toBe(false);
    expect(photonCalc(demo, { ...base, energy: 18, mu: 100 }).ok).toBe(false);
    const e = electronCalc(demo, { energy: 9, applicator: 'A99', depth: 2, mu: 100 });
    expect(!e.ok && e.issues[0]!.found).toBe('A99');
  });
  it('finds the depth of a stated isodose beyond dmax for an electron prescription', () => {
    const e = electronCalc(demo, { energy: 9, applicator: 'A10', isodose: 90, dose: 200 });
    expect(e.ok && e.value.input.depthCm).toBeGreaterThan(2);
    expect(e.ok && e.value.isodosePercent).toBe(90);
  });
});

describe('the manual calculation flags what check flags', () => {
  it('an electron point on the fall-off, and MU beyond the machine (the demo machine declares 999 MU per beam)', () => {
    const r = electronCalc(demo, { energy: 9, applicator: 'A10', depth: 5, dose: 200 });
    if (!r.ok) throw new Error('refused');
    expect(r.value.flags.map((f) => f.code)).toEqual(['steep-fall-off', 'mu-beyond-machine']);
  });
  it('an electron point at dmax, and a photon point at 10 cm for 100 MU, are not flagged', () => {
    const e = electronCalc(demo, { energy: 9, applicator: 'A10', isodose: 100, mu: 100 });
    expect(e.ok && e.value.flags).toEqual([]);
    const p = photonCalc(demo, { ...base, mu: 100 });
    expect(p.ok && p.value.flags).toEqual([]);
  });
});
