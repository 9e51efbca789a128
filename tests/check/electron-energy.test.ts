/**
 * An electron beam's energy from its depth dose: E0 ≈ 2.33 MeV/cm × R50 (the usual broad-beam
 * relation, from memory), against the nominal energy.
 */
import { describe, expect, it } from 'vitest';
import { compareElectronEnergy } from '../../src/check/index.js';
import type { ElectronBeamModel } from '../../src/model/index.js';
import { makeTableLookup } from '../../src/beamdata/table-lookup.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const e = (id: string) => demo.electronBeams.find((b) => b.id === id)! as ElectronBeamModel;

describe("an electron beam's energy from its R50", () => {
  it('the demo beams come out near their nominal energies', () => {
    for (const id of ['6E', '9E', '12E']) expect(Math.abs(compareElectronEnergy(e(id)).differencePercent!)).toBeLessThan(5);
  });
  it('a 9 MeV depth dose filed under 6 MeV is about 50 % off', () => {
    const c = compareElectronEnergy({ ...e('9E'), nominalEnergyMeV: 6 });
    expect(c.differencePercent).toBeGreaterThan(40);
  });
});

describe("an electron beam's practical range", () => {
  /** A hand-made depth dose: 100 % from 1 to 2 cm, falling linearly to 0 at 5 cm, 0 below; the same for every field. */
  function linearFallOff(nominalEnergyMeV: number): ElectronBeamModel {
    const depths = [0, 1, 2, 3, 4, 5, 6, 7, 8];
    const sides = [5, 10, 20];
    const pdd = (d: number) => (d <= 2 ? (d < 1 ? 80 + 20 * d : 100) : Math.max(0, (100 * (5 - d)) / 3));
    const values = new Float64Array(depths.flatMap((d) => sides.map(() => pdd(d))));
    const table = makeTableLookup({
      name: 'electron pdd (test)',
      rows: { name: 'depth', unit: 'cm', values: Float64Array.from(depths) },
      columns: { name: 'fieldSide', unit: 'cm', values: Float64Array.from(sides) },
      values,
      interpolation: 'bilinear',
    });
    return { ...e('9E'), nominalEnergyMeV, pdd: Object.assign(table, { ssdCm: 100 }) };
  }
  it('is where the tangent through R50 meets the tail: 5.0 cm for a straight fall-off from 2 to 5 cm (by hand)', () => {
    // R80 = 2.6, R50 = 3.5, R20 = 4.4 cm; slope 60 %/1.8 cm; 3.5 + 50/(60/1.8) = 5.0 cm; against E/2 = 5 cm for 10 MeV.
    const c = compareElectronEnergy(linearFallOff(10));
    expect(c.r50Cm).toBeCloseTo(3.5, 6);
    expect(c.rpCm).toBeCloseTo(5, 6);
    expect(c.rpDifferencePercent).toBeCloseTo(0, 6);
    expect(compareElectronEnergy(linearFallOff(6)).rpDifferencePercent).toBeCloseTo(((5 - 3) / 3) * 100, 6);
  });
  it('the demo beams lie within the rule of thumb Rp ≈ E/2 cm (from memory) by 20 %', () => {
    for (const id of ['6E', '9E', '12E']) expect(Math.abs(compareElectronEnergy(e(id)).rpDifferencePercent!)).toBeLessThan(20);
  });
});
