import type { DeviationCause } from '../../model/index.js';

/** Causes smaller than this (percent of dose) are noise, not said. */
export const NOISE_PERCENT = 0.1;

/** What is left of the deviation once the causes' ratios are divided out (percent). */
export function residual(deviationPercent: number, causes: readonly DeviationCause[]): number {
  const explained = causes.reduce((p, c) => p * (1 + c.contributionPercent / 100), 1);
  return 100 * ((1 + deviationPercent / 100) / explained - 1);
}

/** A sensitivity worth naming as a possible cause (percent, unsigned), or undefined when it is noise. */
export const sensitivity = (percent: number): number | undefined =>
  Math.abs(percent) >= NOISE_PERCENT && Number.isFinite(percent) ? Math.abs(percent) : undefined;

/**
 * Possible causes (each carrying its sensitivity, unsigned) share what is left to explain, with its
 * sign: each as large as its sensitivity at most, and together never more than what is left, in
 * proportion to their sensitivities when they would be (no cause is favoured by the order it was found
 * in). Shares that fall to noise are not said.
 */
export function shareLeft(possible: readonly DeviationCause[], leftPercent: number): DeviationCause[] {
  const total = possible.reduce((s, c) => s + c.contributionPercent, 0);
  const scale = total > Math.abs(leftPercent) ? Math.abs(leftPercent) / total : 1;
  return possible
    .map((c) => ({ ...c, contributionPercent: Math.sign(leftPercent) * c.contributionPercent * scale }))
    .filter((c) => Math.abs(c.contributionPercent) >= NOISE_PERCENT);
}
