import type { BeamCheck, CheckedBeam, DeviationCause, Explanation, FractionGroupCheck, PlanCheck } from '../model/index.js';
import { explainBeams, type ExplainOptions, type Recheck, summarised } from './explain.js';
import { courseTotals, pointKey } from './totals.js';

type Total = PlanCheck['courseTotals'][number];
/** A beam at a total's point with its weight: fractions × its planning-system dose. */
interface Weighted {
  readonly beam: CheckedBeam;
  readonly weight: number;
}

const CONFIDENCE_ORDER: readonly DeviationCause['confidence'][] = ['possible', 'estimated', 'measured'];

/** Whether a total is beyond the smallest tolerance of its beams (or every total is wanted). */
export function totalNeedsExplaining(t: Total, beams: readonly BeamCheck[], all: boolean): boolean {
  if (t.deviationPercent === undefined) return false;
  const at = beams.filter((b): b is CheckedBeam => b.status === 'checked' && t.beams.includes(b.beamNumber));
  return all || (at.length > 0 && Math.abs(t.deviationPercent) > Math.min(...at.map((b) => b.tolerancePercent)));
}

/** The fraction group's totals, each beyond tolerance explained from its beams' explanations. */
export function explainGroupTotals(g: FractionGroupCheck, all: boolean): FractionGroupCheck {
  const totals = g.totals.map((t) => {
    if (!totalNeedsExplaining(t, g.beams, all)) return t;
    const at = atPoint(g.beams, t).map((beam) => ({ beam, weight: beam.planningSystemDoseCGy! }));
    return withExplanation(t, at);
  });
  return { ...g, totals };
}

/** The course totals, each beyond tolerance explained from every group's beams weighed by the group's fractions. */
export function explainCourseTotals(totals: readonly Total[], groups: readonly FractionGroupCheck[], all: boolean): Total[] {
  const beams = groups.flatMap((g) => g.beams);
  return totals.map((t) => {
    if (!totalNeedsExplaining(t, beams, all)) return t;
    const at = groups.flatMap((g) => atPoint(g.beams, t).map((beam) => ({ beam, weight: (g.fractionsPlanned ?? 0) * beam.planningSystemDoseCGy! })));
    return withExplanation(t, at);
  });
}

function atPoint(beams: readonly BeamCheck[], t: Total): CheckedBeam[] {
  return beams.filter(
    (b): b is CheckedBeam =>
      b.status === 'checked' && b.planningSystemDoseCGy !== undefined && pointKey(b.point.patientMm) === pointKey(t.pointPatientMm),
  );
}

function withExplanation(t: Total, at: readonly Weighted[]): Total {
  const explanation = totalExplanation(t.deviationPercent!, at);
  return explanation ? { ...t, explanation } : t;
}

/**
 * A total's causes from its beams': a beam's deviation shares out over its causes as their logs do
 * (so a beam's shares add to its deviation), each share weighed by the beam's part of the planning
 * system's dose at the point; the same cause of several beams is one cause of the total, its
 * confidence the weakest of theirs. Returned as ratios (as a beam's causes are), so they multiply
 * with the residual to the total's deviation.
 */
export function totalExplanation(deviationPercent: number, at: readonly Weighted[]): Explanation | undefined {
  const sum = at.reduce((s, w) => s + w.weight, 0);
  if (!(sum > 0) || at.some((w) => !w.beam.explanation)) return undefined;
  const byCode = new Map<DeviationCause['code'], { share: number; beams: number[]; confidence: DeviationCause['confidence']; estimated: boolean }>();
  for (const { beam, weight } of at) {
    const e = beam.explanation!;
    const logDeviation = Math.log1p(e.deviationPercent / 100);
    for (const c of e.causes) {
      const part =
        Math.abs(logDeviation) > 1e-12 ? (e.deviationPercent * Math.log1p(c.contributionPercent / 100)) / logDeviation : c.contributionPercent;
      const prev = byCode.get(c.code);
      const confidence = prev && CONFIDENCE_ORDER.indexOf(prev.confidence) < CONFIDENCE_ORDER.indexOf(c.confidence) ? prev.confidence : c.confidence;
      byCode.set(c.code, {
        share: (prev?.share ?? 0) + (weight / sum) * part,
        beams: [...(prev?.beams ?? []), beam.beamNumber],
        confidence,
        estimated: (prev?.estimated ?? true) && c.estimated !== false,
      });
    }
  }
  // Shares are percent of the total's dose, adding up to its deviation; as ratios they multiply to it.
  const scale = Math.abs(deviationPercent) > 1e-12 ? Math.log1p(deviationPercent / 100) / (deviationPercent / 100) : 1;
  const causes: DeviationCause[] = [...byCode.entries()].map(([code, c]) => ({
    code,
    beams: c.beams,
    contributionPercent: 100 * Math.expm1((scale * c.share) / 100),
    confidence: c.confidence,
    ...(c.estimated ? {} : { estimated: false }),
    evidence: { beams: c.beams.join(', ') },
  }));
  causes.sort((x, y) => Math.abs(y.contributionPercent) - Math.abs(x.contributionPercent));
  return summarised(deviationPercent, causes);
}

/**
 * Every explanation of a plan: the beams outside tolerance (or all), and the totals outside
 * tolerance from their beams, whose causes are found for that even when a beam is itself within
 * tolerance (such a beam's own explanation is then left out of the result, as it was not asked for).
 */
export function explainPlan(
  groups: readonly FractionGroupCheck[],
  o: Omit<ExplainOptions, 'recheck'>,
  recheckFor: (groupNumber: number) => Recheck | undefined,
): { groups: FractionGroupCheck[]; courseTotals: Total[] } {
  const course = courseTotals(groups);
  const allBeams = groups.flatMap((g) => g.beams);
  const wanted = [
    ...groups.flatMap((g) => g.totals.filter((t) => totalNeedsExplaining(t, g.beams, o.all))),
    ...course.filter((t) => totalNeedsExplaining(t, allBeams, o.all)),
  ];
  const force = new Set(wanted.flatMap((t) => t.beams));
  const explained = groups.map((g) =>
    explainGroupTotals({ ...g, beams: explainBeams(g.beams, { ...o, recheck: recheckFor(g.number) }, force) }, o.all),
  );
  const totals = explainCourseTotals(courseTotals(explained), explained, o.all);
  const asked = (b: BeamCheck): BeamCheck =>
    b.status === 'checked' && b.explanation && b.verdict === 'within tolerance' && !o.all ? withoutExplanation(b) : b;
  return { groups: explained.map((g) => ({ ...g, beams: g.beams.map(asked) })), courseTotals: totals };
}

function withoutExplanation(b: CheckedBeam): CheckedBeam {
  const { explanation: _, ...rest } = b;
  return rest;
}
