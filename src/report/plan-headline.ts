import type { PlanCheck } from '../model/index.js';

/**
 * A plan's headline in words: refused when its input was wrong, else its verdict, and "not fully
 * verified" beside a verdict that does not already say so (a plan beyond its action level with a
 * beam unchecked).
 */
export function planHeadline(p: Pick<PlanCheck, 'issues' | 'verdict' | 'fullyVerified'>): string {
  if (p.issues.length) return 'refused (input error)';
  return p.verdict === 'not verified' || p.fullyVerified ? p.verdict : `${p.verdict}, not fully verified`;
}

/** Whether the plan needs a physicist's look beyond the routine: anything but a clean within tolerance. */
export const needsAttention = (p: Pick<PlanCheck, 'issues' | 'verdict' | 'fullyVerified'>): boolean =>
  p.issues.length > 0 || p.verdict !== 'within tolerance' || !p.fullyVerified;
