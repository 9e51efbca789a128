/**
 * Wedges in the check: the physical wedge's off-axis profile along its axis (the heel's direction from
 * the beam data's stated convention and the IEC 61217 frames: at gantry and collimator 0 on a head-first
 * supine patient the BEAM LIMITING DEVICE's +Y points toward the gantry, i.e. superior), and jaw-swept
 * (dynamic) wedges from their table by angle and field length. The factor values are the invented demo
 * machine's; what the tests check is that the right entry is found for the geometry.
 */
import { describe, expect, it } from 'vitest';
import { staticBeam, type BeamSpec } from '../../scripts/fixtures/plan-parts.js';
import { checkOneBeam, factorOf, type TestBeam, w30Beam } from '../helpers/check-run.js';
import { DEMO_MANIFEST, beam as dataBeam, machine } from '../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const iso: [number, number, number] = [0, 0, 0];
const run = (name: string, b: BeamSpec, point: [number, number, number] = iso, m = demo): TestBeam => checkOneBeam(name, b, m, point);
const w30 = w30Beam;
const factor = factorOf;

describe('physical wedge profiles', () => {
  const profile = dataBeam(demo, '6X').wedges.find((w) => w.id === 'W30')!.profile!;
  it('on the central axis the profile is 1 (the wedge factor alone)', () => {
    expect(factor(run('w-axis', w30(0)), 'WP')!.value).toBeCloseTo(1, 12);
  });
  it('4 cm superior of the axis at the isocenter: toward the toe at orientation 0 (heel at −Y), toward the heel at 180', () => {
    const sup: [number, number, number] = [0, 0, 40];
    const at0 = factor(run('w-0', w30(0), sup), 'WP')!;
    const at180 = factor(run('w-180', w30(180), sup), 'WP')!;
    expect(at0.args[1]).toBeCloseTo(-4, 9);
    expect(at180.args[1]).toBeCloseTo(4, 9);
    expect(at0.value).toBeGreaterThan(1);
    expect(at180.value).toBeLessThan(1);
    expect(at0.value).toBeCloseTo(profile.at(10, -4, []), 12);
  });
  it("at orientation 90 the wedge lies along X (heel at +X): a point 4 cm to the patient's left is 4 cm toward the heel", () => {
    // HFS, gantry 0: the BEAM LIMITING DEVICE's +X is the patient's left, +x in LPS.
    const left = factor(run('w-90', w30(90), [40, 0, 0]), 'WP')!;
    expect(left.args[1]).toBeCloseTo(4, 9);
    expect(left.value).toBeLessThan(1);
  });
});

describe('the wedge factor of a rectangular field', () => {
  it("is looked up at the jaw rectangle's equivalent square by 4A/P (20 × 10: 13.33 cm), the square the wedge data were measured with", () => {
    // A rectangle's equivalent square by 4A/P, wedge factors tabulated for square jaw settings (common practice, no source).
    // The collimator-exchange constant weights the jaws for Sc (head scatter) only: Sc's square differs.
    const b = run(
      'w-rect',
      staticBeam(1, 'AP W30', 6, 0, 900, iso, {
        wedge: { id: 'W30', angle: 30, factor: 0.68, orientation: 0 },
        first: { wedgeIn: true, jawsXMm: [-100, 100], jawsYMm: [-50, 50] },
      }),
    );
    const wf = factor(b, 'WF')!;
    expect(wf.args[0]).toBeCloseTo((4 * 20 * 10) / (2 * (20 + 10)), 12);
    expect(wf.value).toBeCloseTo(
      dataBeam(demo, '6X')
        .wedges.find((w) => w.id === 'W30')!
        .factor.at(40 / 3, 0, []),
      12,
    );
    expect(b.calculation!.collimatorSquareCm).not.toBeCloseTo(40 / 3, 3);
  });
});

describe('jaw-swept (dynamic) wedges', () => {
  const table = dataBeam(demo, '6X').sweptWedge!;
  const swept = (jawsY: readonly [number, number], moving = false): BeamSpec => {
    const b = staticBeam(1, 'AP SW30', 6, 0, 900, iso, {
      wedge: { id: 'SW30', angle: 30, factor: 0.75, orientation: 0, type: 'DYNAMIC' },
      first: { wedgeIn: true, jawsXMm: [-60, 60], jawsYMm: jawsY },
    });
    if (!moving) return b;
    // The Y1 jaw sweeps from the closed position to its final place during delivery.
    return {
      ...b,
      dynamic: true,
      controlPoints: [
        { ...b.controlPoints[0]!, jawsYMm: [jawsY[1] - 5, jawsY[1]] },
        { weight: 0.5, jawsYMm: [(jawsY[0] + jawsY[1]) / 2, jawsY[1]] },
        { weight: 1, jawsYMm: jawsY, doseCoefficient: 1 },
      ],
    };
  };
  it("the factor is the table's at the wedge angle and the field length along the sweep (Y at orientation 0)", () => {
    const b = run('sw', swept([-50, 50]));
    expect(b.status).toBe('checked');
    const wf = factor(b, 'WF')!;
    expect(wf.name).toBe('swept 30°');
    expect(wf.value).toBeCloseTo(table.at(30, 10, []), 12);
    expect(b.category).toBe('off-axis-or-wedged');
  });
  it("with the jaw moving in the control points, the field is the jaws' envelope: the same dose as the static description", () => {
    const a = run('sw-static', swept([-50, 50]));
    const m = run('sw-moving', swept([-50, 50], true));
    expect(m.status).toBe('checked');
    expect(m.calculation!.modulated).toBeUndefined();
    expect(m.calculation!.dosePerMuCGy).toBeCloseTo(a.calculation!.dosePerMuCGy, 12);
  });
});
