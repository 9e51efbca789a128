import { describe, expect, it } from 'vitest';
import { staticBeam } from '../../scripts/fixtures/plan-parts.js';
import { isModulated, isSupportedPosition, unsupportedReason } from '../../src/check/beam-support.js';
import type { Beam } from '../../src/model/index.js';
import { oneBeamPlan } from '../helpers/check-run.js';

const iso: [number, number, number] = [0, 0, 0];
const beam = oneBeamPlan('support', staticBeam(1, 'AP', 6, 0, 900, iso), iso).beams[0]!;
const code = (b: Beam, position: string | undefined = 'HFS', mu: number | undefined = 100) => unsupportedReason(b, position, mu)?.code;

describe('what the engine can check', () => {
  it('a static photon beam with its MU, position, isocenter and energy: yes', () => {
    expect(code(beam)).toBeUndefined();
    expect(isModulated(beam)).toBe(false);
  });
  it('says why not, never a made-up number: set-up beams, other particles, minutes, no MU, compensators, no position', () => {
    expect(code({ ...beam, treatmentDeliveryType: 'SETUP' })).toBe('setup-beam');
    expect(code({ ...beam, radiationType: 'PROTON' })).toBe('radiation-type');
    expect(code({ ...beam, primaryDosimeterUnit: 'MINUTE' })).toBe('meterset-in-minutes');
    expect(code(beam, 'HFS', 0)).toBe('no-meterset');
    expect(unsupportedReason(beam, undefined, 100)?.code).toBe('no-patient-position');
    expect(code(beam, 'SITTING')).toBe('patient-position');
    expect(code({ ...beam, compensators: [{} as Beam['compensators'][number]] })).toBe('compensator');
  });
  it('a beam whose gantry turns is summed segment by segment', () => {
    const cps = beam.controlPoints.map((c, k) => ({ ...c, gantryAngleDeg: k * 10 }));
    expect(isModulated({ ...beam, controlPoints: cps })).toBe(true);
    expect(isSupportedPosition('HFS')).toBe(true);
    expect(isSupportedPosition('SITTING')).toBe(false);
  });
});
