import type { CaseCategory } from '../model/index.js';
import type { Policy } from './policy.js';

/**
 * Our dose for the planned MU and the MU for the planning system's dose, and the deviation of each:
 * (independent − planning system) / planning system.
 */
export function comparison(plannedMu: number, dosePerMuCGy: number, planningSystemDoseCGy: number | undefined): {
  independentDoseCGy: number; independentMu?: number; doseDeviationPercent?: number; muDeviationPercent?: number;
} {
  const independentDoseCGy = plannedMu * dosePerMuCGy;
  const tps = planningSystemDoseCGy;
  if (tps === undefined) return { independentDoseCGy };
  const independentMu = tps / dosePerMuCGy;
  return {
    independentDoseCGy, independentMu, muDeviationPercent: (100 * (independentMu - plannedMu)) / plannedMu,
    ...(tps > 0 ? { doseDeviationPercent: (100 * (independentDoseCGy - tps)) / tps } : {}),
  };
}

/** Whether the densities met on the ray leave the policy's water-like range. */
export function isHeterogeneous(policy: Policy, densityRange: readonly [number, number] | undefined): boolean {
  return !!densityRange && (densityRange[0] < policy.ct.waterLikeDensity[0] || densityRange[1] > policy.ct.waterLikeDensity[1]);
}

/** A category with the levels the policy sets for it, as a checked beam carries them. */
export function levelsOf(policy: Policy, category: CaseCategory): { category: CaseCategory; tolerancePercent: number; actionPercent: number } {
  return { category, tolerancePercent: policy.levels[category]!.tolerancePercent, actionPercent: policy.levels[category]!.actionPercent };
}
