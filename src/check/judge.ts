import { type BeamCheck, type CalculatedBeam, type CheckedBeam, note, type Note, type NotCheckedBeam, type PlanVerdict } from '../model/index.js';
import { percentDeviation, percentOf } from './deviation.js';
import type { Policy } from './policy.js';
import { pointKey } from './totals.js';
import { verdictFor, worst } from './verdict.js';

/**
 * Verdicts per beam: the deviation against the category's levels, a beam giving little to its
 * point judged on its share of the point's dose, modulated beams on their composite at the point;
 * never better, only worse, for a point the plan's Beam Dose may not refer to, a point unfit for a
 * point check, or an SSD the CT does not confirm.
 */
export function judge(beams: readonly (CalculatedBeam | NotCheckedBeam)[], policy: Policy): BeamCheck[] {
  const composites = modulatedComposites(beams);
  // The point's dose is the planning system's doses of the beams checked there (a beam not checked
  // has no point of ours); a smaller total only makes the share larger, so the judging stricter.
  const byPoint = new Map<string, number>();
  for (const b of beams)
    if (b.status === 'checked' && b.planningSystemDoseCGy !== undefined) {
      byPoint.set(pointKey(b.point.patientMm), (byPoint.get(pointKey(b.point.patientMm)) ?? 0) + b.planningSystemDoseCGy);
    }
  return beams.map((b) =>
    b.status === 'checked' ? judgeBeam(b, byPoint.get(pointKey(b.point.patientMm)) ?? 0, policy, composites.get(b.beamNumber)) : b,
  );
}

/** Modulated beams with a planning-system dose at one point: their composite deviation there. */
interface Composite {
  readonly beams: number;
  readonly deviationPercent: number;
}

/**
 * Per-beam deviations of modulated beams are large and partly cancel between beams (each beam's
 * segments sample the point differently), so modulated beams are judged on the sum of the
 * modulated beams at their point, per fraction group (common practice, no source); each beam's
 * own deviation stays in the result for information.
 */
function modulatedComposites(beams: readonly (CalculatedBeam | NotCheckedBeam)[]): Map<number, Composite> {
  const byPoint = new Map<string, CalculatedBeam[]>();
  for (const b of beams) {
    if (b.status !== 'checked' || b.category !== 'modulated' || !(b.planningSystemDoseCGy! > 0)) continue;
    if (b.point.source === 'user' && !b.point.planningSystemDoseHere && b.planningSystemDoseFrom !== 'dose grid') continue;
    const k = pointKey(b.point.patientMm);
    byPoint.set(k, [...(byPoint.get(k) ?? []), b]);
  }
  const out = new Map<number, Composite>();
  for (const at of byPoint.values()) {
    const ours = at.reduce((s, b) => s + b.calculation.independentDoseCGy, 0);
    const theirs = at.reduce((s, b) => s + b.planningSystemDoseCGy!, 0);
    const deviationPercent = percentDeviation(ours, theirs);
    if (deviationPercent === undefined) continue;
    for (const b of at) out.set(b.beamNumber, { beams: at.length, deviationPercent });
  }
  return out;
}

function judgeBeam(b: CalculatedBeam, pointTotalCGy: number, policy: Policy, composite: Composite | undefined): CheckedBeam {
  const reasons: Note[] = [];
  const tps = b.planningSystemDoseCGy;
  const share = tps !== undefined && pointTotalCGy > 0 ? tps / pointTotalCGy : undefined;
  let verdict: PlanVerdict;
  let judgedDeviationPercent: number | undefined;
  let judgedOn: CheckedBeam['judgedOn'];
  const userPointAlone = b.point.source === 'user' && !b.point.planningSystemDoseHere && tps === undefined;
  if (userPointAlone) {
    // Our dose at a point of the user's, with no dose of the planning system known there: nothing to judge.
    verdict = 'not verified';
    reasons.push(note('no-dose-at-point'));
  } else if (tps === undefined || !(tps > 0) || b.calculation.doseDeviationPercent === undefined) {
    verdict = 'needs review';
    reasons.push(note('no-beam-dose'));
  } else if (composite) {
    judgedDeviationPercent = composite.deviationPercent;
    judgedOn = 'composite of the modulated beams';
    verdict = verdictFor(judgedDeviationPercent, b.tolerancePercent, b.actionPercent);
    reasons.push(note('judged-on-composite', { ...composite }));
  } else if (share !== undefined && share < policy.lowContributionShare) {
    // The deviation in percent of the point's dose: (independent − planning system) / point total.
    judgedDeviationPercent = percentOf(b.calculation.independentDoseCGy - tps, pointTotalCGy);
    judgedOn = 'share of the point dose';
    verdict = judgedDeviationPercent === undefined ? 'needs review' : verdictFor(judgedDeviationPercent, b.tolerancePercent, b.actionPercent);
    reasons.push(note('judged-on-share', { sharePercent: percentOf(tps, pointTotalCGy) }));
  } else {
    judgedDeviationPercent = b.calculation.doseDeviationPercent;
    judgedOn = 'beam dose';
    verdict = verdictFor(judgedDeviationPercent, b.tolerancePercent, b.actionPercent);
  }
  if (b.planningSystemDoseFrom === 'dose grid') reasons.push(note('compared-with-dose-grid'));
  else if (!b.point.planningSystemDoseHere && !userPointAlone) {
    // The Beam Dose of a plan that does not say where it applies may or may not be at our point.
    verdict = worst(verdict, 'needs review');
    reasons.push(note('dose-point-unstated'));
  }
  if (b.fitness.flags.length) {
    verdict = worst(verdict, 'needs review');
    reasons.push(note('point-unfit', { flags: b.fitness.flags.length }));
  }
  const ct = b.calculation.ct;
  if (ct) {
    reasons.push(note('ct-correction', { method: ct.method, correctionFactor: ct.correctionFactor, homogeneousDoseCGy: ct.homogeneousDoseCGy }));
    if (ct.ssdDifferenceMm !== undefined && Math.abs(ct.ssdDifferenceMm) > policy.ct.ssdToleranceMm) {
      verdict = worst(verdict, 'needs review');
      reasons.push(
        note('ct-ssd-differs', {
          ctSsdMm: ct.ssdAlongAxisMm,
          planSsdMm: ct.planSsdMm,
          differenceMm: ct.ssdDifferenceMm,
          toleranceMm: policy.ct.ssdToleranceMm,
        }),
      );
    }
  }
  if (b.calculation.planningSystemDepths) reasons.push(note('planning-system-depths'));
  return {
    ...b,
    verdict,
    verdictReasons: reasons,
    ...(judgedDeviationPercent !== undefined ? { judgedDeviationPercent } : {}),
    ...(judgedOn ? { judgedOn } : {}),
  };
}
