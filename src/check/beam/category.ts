import type { BeamCheckContext } from './context.js';
import type { CaseCategory } from '../../model/index.js';
import type { Policy } from '../policy.js';

/** What decides a beam's category: the most demanding one that applies. */
export interface CategoryFacts {
  readonly wedged: boolean;
  readonly offAxisCm: number;
  readonly irradiatedSquareCm: number;
  readonly openFraction: number;
  readonly ssdCm: number;
  readonly shaped: boolean;
  readonly heterogeneous: boolean;
}

/** The most demanding category that applies (the one with the widest action level). */
export function categorize(policy: Policy, c: CategoryFacts): CaseCategory {
  const cls = policy.classification;
  const applicable: CaseCategory[] = ['on-axis-open'];
  if (c.wedged || c.offAxisCm > cls.offAxisCm) applicable.push('off-axis-or-wedged');
  if (c.irradiatedSquareCm < cls.smallFieldCm || (c.shaped && c.openFraction < cls.openFractionBelow)) applicable.push('irregular-or-small');
  if (c.ssdCm > cls.largeSsdCm) applicable.push('large-ssd');
  if (c.heterogeneous) applicable.push('heterogeneous');
  return applicable.reduce((a, b) => (policy.levels[b]!.actionPercent > policy.levels[a]!.actionPercent ? b : a));
}

/**
 * Whether the case is heterogeneous: with the CT, the densities met on the ray leave the policy's
 * water-like range; without it, the planning system's RT Dose says its dose is heterogeneity
 * corrected (ours is then homogeneous, and the plan's warnings say so).
 */
export function isHeterogeneous(policy: Policy, densityRange: readonly [number, number] | undefined, planningSystemCorrected?: boolean): boolean {
  if (!densityRange) return planningSystemCorrected === true;
  return densityRange[0] < policy.ct.waterLikeDensity[0] || densityRange[1] > policy.ct.waterLikeDensity[1];
}

/** A category with the levels the policy sets for it, as a checked beam carries them. */
export function levelsOf(policy: Policy, category: CaseCategory): { category: CaseCategory; tolerancePercent: number; actionPercent: number } {
  return { category, tolerancePercent: policy.levels[category]!.tolerancePercent, actionPercent: policy.levels[category]!.actionPercent };
}

/**
 * Whether the planning system corrected this beam's dose for heterogeneity, as far as it says: its
 * own Beam Dose Point Equivalent Depth against its depth, else the plan's or RT Dose's word.
 */
export function planningSystemCorrectedBeam(ctx: BeamCheckContext): boolean | undefined {
  const t = ctx.planningSystemDepths;
  if (t?.depthMm !== undefined && t.equivalentDepthMm !== undefined) return Math.abs(t.equivalentDepthMm - t.depthMm) > 1;
  return ctx.planningSystemCorrected;
}
