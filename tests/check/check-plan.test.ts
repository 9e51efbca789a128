import { describe, expect, it } from 'vitest';
import { DEFAULT_POLICY, Policy, verdictFor } from '../../src/check/index.js';
import { beams, check, importOrThrow } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';
import { fileURLToPath } from 'node:url';

const clinic = (f: string) => fileURLToPath(new URL(`../../fixtures/demo/clinic/${f}`, import.meta.url));
const demo = machine(DEMO_MANIFEST);

describe('verdicts', () => {
  it('within the tolerance, beyond the action level, or between (boundaries inclusive of the tolerance)', () => {
    expect(verdictFor(2, 2, 3)).toBe('within tolerance');
    expect(verdictFor(-2.01, 2, 3)).toBe('needs review');
    expect(verdictFor(3, 2, 3)).toBe('needs review');
    expect(verdictFor(-3.01, 2, 3)).toBe('beyond action level');
  });
  it('the shipped policy is valid and covers every category', () => {
    expect(Policy.safeParse(DEFAULT_POLICY).success).toBe(true);
    expect(Policy.safeParse({ ...DEFAULT_POLICY, levels: { 'on-axis-open': { tolerancePercent: 2, actionPercent: 1 } } }).success).toBe(false);
  });
});

describe('checking the demo clinic', () => {
  it('flags the mis-typed MU of the lateral tangent beyond the action level, and the other beam within tolerance', () => {
    const r = check(importOrThrow(clinic('breast-tangents.dcm')), demo);
    const [med, lat] = beams(r);
    expect(med!.verdict).toBe('within tolerance');
    expect(lat!.verdict).toBe('beyond action level');
    expect(lat!.calculation!.muDeviationPercent).toBeLessThan(-8);
    expect(lat!.category).toBe('off-axis-or-wedged');
    expect(r.verdict).toBe('beyond action level');
  });

  it('checks the electron field with its applicator and circular cutout (equal-area square), and the two-arc VMAT plan', () => {
    const e = check(importOrThrow(clinic('chestwall-electron.dcm')), demo);
    const b = beams(e)[0]!;
    expect(b.status).toBe('checked');
    expect(b.calculation!.factors.map((f) => f.key)).toEqual(['D0', 'Se', 'PDD', 'ISF']);
    // The cutout, a regular 24-gon of radius 3 cm, has the area 12·r²·sin 15°: the square of equal area has its root as side.
    expect(b.calculation!.irradiatedSquareCm).toBeCloseTo(3 * Math.sqrt(12 * Math.sin(Math.PI / 12)), 3); // vertices written to 0.01 mm
    expect(e.fullyVerified).toBe(true);
    const v = check(importOrThrow(clinic('prostate-vmat.dcm')), demo);
    expect(beams(v).map((x) => x.category)).toEqual(['modulated', 'modulated']);
    expect(v.fullyVerified).toBe(true);
  });

  it('checks the SSD spine field with the PDD formalism and the four-field box with TPR', () => {
    expect(beams(check(importOrThrow(clinic('spine-ssd.dcm')), demo))[0]!.calculation!.factors.map((f) => f.key)).toContain('PDD');
    const box = check(importOrThrow(clinic('pelvis-box.dcm')), demo);
    expect(beams(box).every((b) => b.calculation!.setup === 'SAD')).toBe(true);
    expect(box.fractionGroups[0]!.totals[0]!.prescriptionPerFractionCGy).toBeCloseTo(200, 10);
    // Its planning system corrected for the bone in the PA beam and says so (equivalent depth 131.5 mm at 120 mm): without the
    // CT that beam stands out by +3 %, judged as a heterogeneous case; with --explain, the correction is named as the cause.
    const pa = beams(box)[1]!;
    expect(beams(box).map((b) => b.category)).toEqual(['on-axis-open', 'heterogeneous', 'on-axis-open', 'on-axis-open']);
    expect(pa.calculation!.doseDeviationPercent).toBeGreaterThan(2.5);
    const explained = beams(check(importOrThrow(clinic('pelvis-box.dcm')), demo, { explain: true }))[1]!;
    expect(explained.status === 'checked' && explained.explanation!.causes[0]!.code).toBe('heterogeneity');
  });

  it('integrates the MLC-shaped field by Clarkson sectors (SAD setup) and puts it in the irregular category', () => {
    const b = beams(check(importOrThrow(clinic('lung-mlc.dcm')), demo))[0]!;
    expect(b.calculation!.factors.map((f) => f.key)).toEqual(['D0', 'Sc', 'SpTPR', 'ISF', 'OAR']);
    expect(b.calculation!.approximations).toContainEqual(
      expect.objectContaining({ code: 'clarkson-irregular', values: expect.objectContaining({ mlc: 1, sectors: 72 }) }),
    );
    expect(b.category).toBe('irregular-or-small');
  });
});

describe('the calculation point', () => {
  const brain = importOrThrow(clinic('brain-laterals.dcm'));
  it('a point 1 cm inside the field edge is flagged, a better point suggested, and with --suggest-point checked there', () => {
    // Lateral beams at gantry 90/270 with Y jaws ±70 mm: Yb runs along the patient's head-foot axis, so z = 120 + 60 mm is 1 cm inside.
    const r = check(brain, demo, { point: [0, 0, 180], suggest: true });
    const b = beams(r)[0]!;
    expect(b.point!.source).toBe('user');
    const edge = b.fitness!.flags.find((f) => f.code === 'near-field-edge')!;
    expect(edge.values.edgeDistanceCm).toBeGreaterThanOrEqual(0.95);
    expect(edge.values.edgeDistanceCm).toBeLessThan(2);
    expect(b.fitness!.suggestion!.patientMm[2]).toBeCloseTo(120, 0);
    // The suggestion is the field's centre, the isocenter: its dose is the plan's own point's (within rounding of the point).
    const atIso = beams(check(brain, demo))[0]!.calculation!.independentDoseCGy;
    expect(Math.abs(b.suggestedPoint!.independentDoseCGy / atIso - 1)).toBeLessThan(0.002);
    expect(b.verdict).not.toBe('within tolerance');
  });

  it('a beam giving little to the point is judged on its share of the point dose', () => {
    const plan = structuredClone(brain) as any;
    plan.fractionGroups[0].beams[1].beamDoseGy = 0.08; // 7.4 % of the point dose
    plan.fractionGroups[0].beams[1].beamMeterset = 9.5;
    const b = beams(check(plan, demo))[1]!;
    expect(b.judgedOn).toBe('share of the point dose');
    expect(b.verdictReasons.map((r) => r.code)).toContain('judged-on-share');
    expect(Math.abs(b.judgedDeviationPercent!)).toBeLessThan(Math.abs(b.calculation!.doseDeviationPercent!));
  });

  it('a plan machine the beam data do not know is an input error naming it, never other data', () => {
    const r = check(brain, demo, { aliases: { NG_LINAC1: 'OTHER' } });
    expect(r.issues[0]!.message).toMatch(/no beam data for machine "NG_LINAC1" \(mapped to "OTHER"\)/);
    expect(beams(r).every((b) => b.status === 'not checked')).toBe(true);
  });
});

describe('a plan is within tolerance only when every beam that delivers dose was checked', () => {
  // Common practice, no source: an independent check that could not judge a beam has not verified the plan.
  const brain = importOrThrow(clinic('brain-laterals.dcm'));

  it('is within tolerance when both beams were checked and agree', () => {
    const r = check(brain, demo);
    expect([r.verdict, r.fullyVerified]).toEqual(['within tolerance', true]);
  });

  it('is "not verified" when it has no fraction group, so no beam could be checked', () => {
    const r = check({ ...brain, fractionGroups: [] }, demo);
    expect([r.verdict, r.fullyVerified]).toEqual(['not verified', false]);
    expect(r.warnings.map((w) => w.code)).toContain('no-beam-checked');
  });

  it('is "not verified" when one beam could not be checked and the other agrees', () => {
    const plan = { ...brain, beams: brain.beams.map((b, i) => (i === 1 ? { ...b, radiationType: 'PROTON' as const } : b)) };
    const r = check(plan, demo);
    expect(beams(r).map((b) => b.status)).toEqual(['checked', 'not checked']);
    expect(r.verdict).toBe('not verified');
  });

  it('keeps "beyond action level" as the headline over "not verified"', () => {
    const tangents = importOrThrow(clinic('breast-tangents.dcm'));
    const plan = { ...tangents, beams: tangents.beams.map((b, i) => (i === 0 ? { ...b, radiationType: 'PROTON' as const } : b)) };
    const r = check(plan, demo);
    expect([r.verdict, r.fullyVerified]).toEqual(['beyond action level', false]);
  });

  it('a setup beam delivers no dose: it leaves the plan verified', () => {
    const setup = { ...brain.beams[0]!, number: 99, name: 'SETUP', treatmentDeliveryType: 'SETUP' as const };
    const g = brain.fractionGroups[0]!;
    const plan = {
      ...brain,
      beams: [...brain.beams, setup],
      fractionGroups: [{ ...g, beams: [...g.beams, { ...g.beams[0]!, beamNumber: 99, beamDoseGy: undefined }] }],
    };
    const r = check(plan, demo);
    expect(beams(r).map((b) => b.status)).toEqual(['checked', 'checked', 'not checked']);
    expect([r.verdict, r.fullyVerified]).toEqual(['within tolerance', true]);
  });
});
