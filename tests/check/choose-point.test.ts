import { describe, expect, it } from 'vitest';
import { staticBeam } from '../../scripts/fixtures/plan-parts.js';
import { choosePoint } from '../../src/check/choose-point.js';
import { oneBeamPlan } from '../helpers/check-run.js';

const iso: [number, number, number] = [0, 0, 0];
const spec: [number, number, number] = [10, -20, 5];
const plan = oneBeamPlan('point', staticBeam(1, 'AP', 6, 0, 900, iso), spec);
const group = plan.fractionGroups[0]!;
const entry = group.beams[0]!;
const beam = plan.beams[0]!;

describe('where to calculate, and why', () => {
  it("the user's point first, saying whether the planning system's dose is stated there", () => {
    expect(choosePoint(plan, group, entry, beam, [10, -20, 5.2])).toEqual({
      source: 'user',
      patientMm: [10, -20, 5.2],
      planningSystemDoseHere: true,
    });
    expect(choosePoint(plan, group, entry, beam, [0, 0, 0])?.planningSystemDoseHere).toBe(false);
  });
  it("then the beam's Beam Dose Specification Point, where the planning system states its dose", () => {
    expect(choosePoint(plan, group, entry, beam)).toEqual({ source: 'beam-dose-specification-point', patientMm: spec, planningSystemDoseHere: true });
  });
  it("without one, the fraction group's only dose reference with a point; without any, the isocenter, its comparison an assumption", () => {
    const { beamDoseSpecificationPointPatientMm: _, ...bare } = entry;
    expect(choosePoint(plan, group, bare, beam)).toMatchObject({
      source: 'dose-reference',
      doseReferenceVia: 'only-in-fraction-group',
      patientMm: spec,
    });
    const noRefs = { ...plan, doseReferences: [] };
    expect(choosePoint(noRefs, { ...group, doseReferences: [] }, bare, beam)).toEqual({
      source: 'isocenter',
      patientMm: iso,
      planningSystemDoseHere: false,
    });
  });
});
