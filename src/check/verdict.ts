import { PlanVerdict, type Verdict } from '../model/index.js';

/** The model lists the verdicts in order of severity; a beam's verdicts are a plan's but one. */
const ORDER: readonly PlanVerdict[] = PlanVerdict.options;

/** Within the tolerance; beyond the action level; or between the two. */
export function verdictFor(deviationPercent: number, tolerancePercent: number, actionPercent: number): Verdict {
  const d = Math.abs(deviationPercent);
  if (d <= tolerancePercent) return 'within tolerance';
  return d > actionPercent ? 'beyond action level' : 'needs review';
}

export function worst<V extends PlanVerdict>(a: V, b: V): V {
  return ORDER.indexOf(a) >= ORDER.indexOf(b) ? a : b;
}
