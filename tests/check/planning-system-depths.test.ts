/**
 * Which of the planning system's depths stand beside ours: those it gives for the point where it
 * states the beam's dose. The rule follows the DICOM RT Beams module, where the Beam Dose
 * Verification Control Point Sequence (point depth, equivalent depth, SSD) sits under each
 * Referenced Dose Reference of a beam (from memory of the module's layout); the depths themselves
 * are the invented demo plan's own (AP beam: 100 mm, 101.5 mm, SSD 900 mm).
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { choosePoint } from '../../src/check/choose-point.js';
import { planningSystemDepths } from '../../src/check/planning-system-depths.js';
import type { Plan } from '../../src/model/index.js';
import { coordinatesDoseReference, staticBeam } from '../../scripts/fixtures/plan-parts.js';
import { beams, check, importOrThrow, planFromSpec } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';
import { planCheckText } from '../../src/report/check-text.js';
import { unwrapped } from '../helpers/text.js';

const plan = importOrThrow(fileURLToPath(new URL('../../fixtures/demo/plans/four-field-box.dcm', import.meta.url)));
const iso = plan.beams[0]!.controlPoints[0]!.isocenterPatientMm!;
const elsewhere: [number, number, number] = [iso[0] + 40, iso[1], iso[2]];

/** The plan with a second dose reference 40 mm off the isocenter, and the AP beam carrying depths for both. */
function withTwoReferences(entryChanges: Record<string, unknown>): Plan {
  const ap = plan.beams[0]!;
  const first = ap.doseVerification[0]!;
  const second = {
    ...first,
    doseReferenceNumber: 2,
    points: first.points.map((p) => ({ ...p, pointDepthMm: 55, equivalentDepthMm: 54, ssdMm: 945 })),
  };
  const group = plan.fractionGroups[0]!;
  return {
    ...plan,
    doseReferences: [...plan.doseReferences, { ...plan.doseReferences[0]!, number: 2, uid: '1.2.826.0.1.3680043.10.1.2', pointPatientMm: elsewhere }],
    beams: [{ ...ap, doseVerification: [first, second] }, ...plan.beams.slice(1)],
    fractionGroups: [{ ...group, beams: [{ ...group.beams[0]!, ...entryChanges }, ...group.beams.slice(1)] }],
  };
}
const depthsOf = (p: Plan, userPoint?: [number, number, number]) => {
  const g = p.fractionGroups[0]!;
  const entry = g.beams[0]!;
  const beam = p.beams[0]!;
  return planningSystemDepths(p, g, entry, beam, choosePoint(p, g, entry, beam, userPoint));
};

describe("the planning system's depths", () => {
  it('are those of the dose reference at the Beam Dose Specification Point', () => {
    expect(depthsOf(plan)).toEqual({ depthMm: 100, equivalentDepthMm: 101.5, ssdMm: 900 });
    expect(depthsOf(withTwoReferences({}))).toEqual({ depthMm: 100, equivalentDepthMm: 101.5, ssdMm: 900 });
  });

  it("are those of the dose reference the beam's Beam Dose refers to, not the first the beam lists", () => {
    const p = withTwoReferences({ beamDoseSpecificationPointPatientMm: undefined, doseReferenceUid: '1.2.826.0.1.3680043.10.1.2' });
    expect(choosePoint(p, p.fractionGroups[0]!, p.fractionGroups[0]!.beams[0]!, p.beams[0]!)?.doseReferenceNumber).toBe(2);
    expect(depthsOf(p)).toEqual({ depthMm: 55, equivalentDepthMm: 54, ssdMm: 945 });
  });

  it("are not compared at a user's point elsewhere, and are at the user's point on the stated one", () => {
    expect(depthsOf(plan, elsewhere)).toBeUndefined();
    expect(depthsOf(plan, [...iso] as [number, number, number])).toEqual({ depthMm: 100, equivalentDepthMm: 101.5, ssdMm: 900 });
  });

  it('stand beside ours in the check, with the differences', () => {
    // One 15 MV AP field at SSD 900 mm to an isocenter 100 mm deep, the planning system's depths
    // written as the demo plans write them (values invented for this test).
    const at: [number, number, number] = [0, 0, 0];
    const { plan: p } = planFromSpec({
      file: 'depths.dcm',
      patientId: 'T-DEPTH',
      patientName: 'Test^Depths',
      label: 'DEPTHS',
      name: 'depths',
      description: 'test plan',
      doseReferences: [coordinatesDoseReference(1, 'isocenter', at, 2)],
      fractionGroups: [{ number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: 200, doseGy: 2, specPoint: at }] }],
      beams: [
        staticBeam(1, 'AP', 15, 0, 900, at, {
          first: { jawsXMm: [-50, 50], jawsYMm: [-50, 50] },
          depthData: { depthMm: 98, equivalentDepthMm: 99, ssdMm: 903 },
        }),
      ],
    });
    const ap = beams(check(p, machine(DEMO_MANIFEST)))[0]!;
    expect(ap.status).toBe('checked');
    const t = ap.calculation!.planningSystemDepths!;
    expect([t.depthMm, t.ssdMm]).toEqual([98, 903]);
    // Ours: SSD 900 mm from the plan, depth SAD - SSD = 100 mm.
    expect(t.depthDifferenceMm).toBeCloseTo(2, 6);
    expect(t.ssdDifferenceMm).toBeCloseTo(-3, 6);
    // The terminal report says so in the beam's notes.
    expect(unwrapped(planCheckText(check(p, machine(DEMO_MANIFEST))).join('\n'))).toMatch(
      /beam 1 AP: the planning system's own depth data: depth 98\.0 mm \(ours \+2\.0 mm\), equivalent depth 99\.0 mm, SSD 903\.0 mm \(ours -3\.0 mm\)/,
    );
    const moved = beams(check(p, machine(DEMO_MANIFEST), { point: [30, 0, 0] }))[0]!;
    expect(moved.status).toBe('checked');
    expect(moved.calculation!.planningSystemDepths).toBeUndefined();
  });
});
