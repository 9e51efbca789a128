import type { Verdict } from '../model/index.js';

const ORDER: readonly Verdict[] = ['within tolerance', 'needs review', 'beyond action level'];

/** Within the tolerance; beyond the action level; or between the two. */
export function verdictFor(deviationPercent: number, tolerancePercent: number, actionPercent: number): Verdict {
  const d = Math.abs(deviationPercent);
  if (d <= tolerancePercent) return 'within tolerance';
  return d > actionPercent ? 'beyond action level' : 'needs review';
}

export function worst(a: Verdict, b: Verdict): Verdict {
  return ORDER.indexOf(a) >= ORDER.indexOf(b) ? a : b;
}
