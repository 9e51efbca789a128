import { describe, expect, it } from 'vitest';
import { fileURLToPath } from 'node:url';
import { machineLimitIssues } from '../../src/check/machine-limits.js';
import type { Beam, Plan } from '../../src/model/index.js';
import { check, importOrThrow } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

// The demo machine declares 40 cm fields, jaws and leaves to 20 cm from the axis, 999 MU per beam
// (invented limits of the usual size, common practice, no source).
const demo = machine(DEMO_MANIFEST);
const brain = importOrThrow(fileURLToPath(new URL('../../fixtures/demo/clinic/brain-laterals.dcm', import.meta.url)));

/** The plan with the first beam's X jaws set at every control point. */
function withXJaws(plan: Plan, x1Mm: number, x2Mm: number): Plan {
  const set = (b: Beam): Beam => ({
    ...b,
    controlPoints: b.controlPoints.map((cp) => ({
      ...cp,
      devices: cp.devices.map((d) => (d.type === 'ASYMX' || d.type === 'X' ? { ...d, positionsMm: [x1Mm, x2Mm] } : d)),
    })),
  });
  return { ...plan, beams: plan.beams.map((b, i) => (i === 0 ? set(b) : b)) };
}

describe("the machine's limits from its beam data", () => {
  it('a field inside them raises nothing', () => {
    const b = withXJaws(brain, -200, 200).beams[0]!;
    expect(machineLimitIssues(b, brain.fractionGroups[0]!.beams[0]!, demo)).toEqual([]);
  });

  it('X jaws at ±250 mm are past their travel: the plan is refused naming the beam, not checked at a saturated field', () => {
    const r = check(withXJaws(brain, -250, 250), demo);
    expect(r.issues).toHaveLength(1);
    expect(r.issues[0]).toMatchObject({ code: 'out-of-range', beamNumber: 1, path: 'LeafJawPositions', found: '25 cm' });
    expect(r.fractionGroups[0]!.beams[0]!.status).toBe('not checked');
  });

  it('an asymmetric opening of 45 cm within each jaw travel is wider than the largest field', () => {
    const b = withXJaws(brain, -200, 250).beams[0]!;
    // 25 cm from the axis is past the 20 cm travel: the travel is said first.
    expect(machineLimitIssues(b, brain.fractionGroups[0]!.beams[0]!, { ...demo, limits: { ...demo.limits!, maxJawPositionCm: 30 } })).toEqual([
      expect.objectContaining({ message: expect.stringMatching(/opening/), found: '45 cm', expected: 'at most 40 cm' }),
    ]);
  });

  it('MU above the most one beam delivers are refused', () => {
    const g = brain.fractionGroups[0]!;
    const plan = { ...brain, fractionGroups: [{ ...g, beams: [{ ...g.beams[0]!, beamMeterset: 1500 }, ...g.beams.slice(1)] }] };
    expect(check(plan, demo).issues).toEqual([expect.objectContaining({ path: 'BeamMeterset', found: '1500 MU', beamNumber: 1 })]);
  });

  it('beam data that declare no limits leave the beam to the plausible ranges of the import', () => {
    const { limits: _, ...unlimited } = demo;
    expect(machineLimitIssues(withXJaws(brain, -250, 250).beams[0]!, brain.fractionGroups[0]!.beams[0]!, unlimited)).toEqual([]);
  });
});
