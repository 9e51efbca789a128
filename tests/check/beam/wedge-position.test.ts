/**
 * Where the point lies along a wedge's gradient: the beam data's wedge profile (physical) or
 * swept-wedge profile (jaw-swept) applies there; without one, or without the heel's direction, a
 * point more than 0.5 cm along the gradient is not checked and a nearer one says it takes the
 * central-axis factor. Directions from the IEC 61217 frames (HFS, gantry and collimator 0: the BEAM
 * LIMITING DEVICE's +Y is superior). Factor values are the invented demo machine's.
 */
import { describe, expect, it } from 'vitest';
import { staticBeam, type BeamSpec } from '../../../scripts/fixtures/plan-parts.js';
import { checkOneBeam, factorOf, type TestBeam, w30Beam } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, beam as dataBeam, machine } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const iso: [number, number, number] = [0, 0, 0];
const run = (name: string, b: BeamSpec, point: [number, number, number] = iso, m = demo): TestBeam => checkOneBeam(name, b, m, point);
const w30 = w30Beam;
const factor = factorOf;

describe('wedges off the central axis along their gradient', () => {
  // HFS, gantry and collimator 0: the BEAM LIMITING DEVICE's +Y is superior (+z); at orientation 0 the heel is at −Y.
  const sw60 = staticBeam(1, 'AP SW60', 6, 0, 900, iso, {
    wedge: { id: 'SW60', angle: 60, factor: 0.44, orientation: 0, type: 'DYNAMIC' },
    first: { wedgeIn: true, jawsXMm: [-75, 75], jawsYMm: [-75, 75] },
  });
  const withoutSweptProfile = {
    ...demo,
    beams: demo.beams.map((b) => {
      if (b.radiationType !== 'PHOTON') return b;
      const { sweptWedgeProfile: _, ...rest } = b;
      return rest;
    }),
  };
  it('a 60° swept wedge, 15 × 15: ±4 cm along the sweep take the swept-wedge profile, the isocenter none (invented demo profile)', () => {
    const profile = dataBeam(demo, '6X').sweptWedgeProfile!;
    const center = run('sw60-0', sw60, iso);
    const toe = run('sw60-toe', sw60, [0, 0, 40]);
    const heel = run('sw60-heel', sw60, [0, 0, -40]);
    expect(factor(center, 'WP')!.value).toBeCloseTo(1, 12);
    expect(factor(toe, 'WP')!.value).toBeCloseTo(profile.at(60, -4, []), 12);
    expect(factor(heel, 'WP')!.value).toBeCloseTo(profile.at(60, 4, []), 12);
    expect(factor(heel, 'WP')!.value).toBeLessThan(0.9);
    // The central-axis factor is the same for the three; the dose is not.
    expect(factor(toe, 'WF')!.value).toBe(factor(heel, 'WF')!.value);
    expect(toe.calculation!.dosePerMuCGy / heel.calculation!.dosePerMuCGy).toBeGreaterThan(1.3);
  });
  it('without a swept-wedge profile: 4 cm along the sweep not checked, with the reason; 0.3 cm checked on the central-axis factor', () => {
    const far = run('sw60-np-far', sw60, [0, 0, 40], withoutSweptProfile);
    expect(far.status).toBe('not checked');
    expect(far.status === 'not checked' && far.reason).toMatchObject({
      code: 'wedge-off-axis',
      values: { kind: 'swept', missing: 'profile', distanceCm: 4 },
    });
    const near = run('sw60-np-near', sw60, [0, 0, 3], withoutSweptProfile);
    expect(near.status).toBe('checked');
    expect(near.calculation!.approximations.map((a) => a.code)).toContain('wedge-central-axis-factor');
    // Across the sweep the dose does not change with the wedge: 4 cm along X is checked.
    expect(run('sw60-np-x', sw60, [40, 0, 0], withoutSweptProfile).status).toBe('checked');
  });
  it('a physical wedge without its profile: 1 cm along the gradient is not checked (the central-axis factor no longer holds)', () => {
    const noProfile = {
      ...demo,
      beams: demo.beams.map((b) => (b.radiationType === 'PHOTON' ? { ...b, wedges: b.wedges.map(({ profile: _, ...w }) => w) } : b)),
    };
    const b = run('w30-np', w30(0), [0, 0, 10], noProfile);
    expect(b.status === 'not checked' && b.reason).toMatchObject({ code: 'wedge-off-axis', values: { kind: 'physical', missing: 'profile' } });
    expect(run('w30-np-0', w30(0), iso, noProfile).status).toBe('checked');
  });
  it("with the profile but no heel convention in the beam data, 1 cm along the wedge's axis is not checked", () => {
    const { wedgeHeel: _, ...noHeel } = demo;
    const b = run('w30-nh', w30(0), [0, 0, 10], noHeel);
    expect(b.status === 'not checked' && b.reason).toMatchObject({ code: 'wedge-off-axis', values: { missing: 'heel' } });
  });
});
