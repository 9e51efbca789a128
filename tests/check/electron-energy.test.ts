/**
 * An electron beam's energy from its depth dose: E0 ≈ 2.33 MeV/cm × R50 (the usual broad-beam
 * relation, from memory), against the nominal energy.
 */
import { describe, expect, it } from 'vitest';
import { compareElectronEnergy } from '../../src/check/index.js';
import type { ElectronBeamModel } from '../../src/model/index.js';
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
