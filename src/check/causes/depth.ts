import { type CheckedBeam, type DeviationCause, MM_PER_CM, type PhotonBeamModel } from '../../model/index.js';
import { projectFieldCm, tprAt } from '../../physics/index.js';

/*
 * Causes from depths: the planning system's stated depth and equivalent depth against ours, and the
 * CT's SSD against the plan's; each the dose ratio the other quantity would make, by the TPR slope.
 */

/**
 * The dose at depth d relative to another depth for this beam's field: TPR at the field's side at
 * that depth, and for an SSD setup (the surface fixed, the point moving) the inverse square as well.
 */
export function depthDose(b: CheckedBeam, data: PhotonBeamModel, sadCm: number): (depthCm: number) => number {
  const c = b.calculation;
  return (d) => {
    const side = projectFieldCm(c.irradiatedSquareCm, sadCm, c.ssdCm + d);
    const isf = c.setup === 'SSD' ? 1 / (c.ssdCm + d) ** 2 : 1;
    return tprAt(data, d, side, []) * isf;
  };
}

/** Our depth against the planning system's stated Beam Dose Point Depth (both along the ray to the point). */
export function depthCause(b: CheckedBeam, f: (depthCm: number) => number): DeviationCause | undefined {
  const t = b.calculation.planningSystemDepths;
  if (t?.depthMm === undefined || t.depthDifferenceMm === undefined) return undefined;
  const theirsCm = t.depthMm / MM_PER_CM;
  const oursCm = theirsCm + t.depthDifferenceMm / MM_PER_CM;
  const ratio = f(oursCm) / f(theirsCm);
  if (!Number.isFinite(ratio)) return undefined;
  return {
    code: 'depth',
    contributionPercent: 100 * (ratio - 1),
    confidence: 'measured',
    evidence: { oursCm, planningSystemCm: theirsCm, differenceCm: oursCm - theirsCm },
  };
}

/**
 * The heterogeneity correction each side made: the planning system's from its Equivalent Depth
 * beside its depth, ours from the CT's radiological depth (none without the CT).
 */
export function heterogeneityCause(b: CheckedBeam, f: (depthCm: number) => number): DeviationCause | undefined {
  const t = b.calculation.planningSystemDepths;
  if (t?.depthMm === undefined || t.equivalentDepthMm === undefined) return undefined;
  const theirs = f(t.equivalentDepthMm / MM_PER_CM) / f(t.depthMm / MM_PER_CM);
  const ct = b.calculation.ct;
  const ours = ct ? ct.correctionFactor : 1;
  const ratio = ours / theirs;
  if (!Number.isFinite(ratio)) return undefined;
  return {
    code: 'heterogeneity',
    contributionPercent: 100 * (ratio - 1),
    confidence: 'measured',
    evidence: {
      planningSystemEquivalentDepthCm: t.equivalentDepthMm / MM_PER_CM,
      planningSystemDepthCm: t.depthMm / MM_PER_CM,
      planningSystemCorrection: theirs,
      ourCorrection: ours,
      ours: ct ? 'the CT' : 'none (no CT)',
    },
  };
}

/** With the CT and no stated depth: the plan's SSD would put the point deeper or shallower than the CT does. */
export function ssdCause(b: CheckedBeam, f: (depthCm: number) => number): DeviationCause | undefined {
  const ct = b.calculation.ct;
  if (!ct || ct.ssdDifferenceMm === undefined || b.calculation.planningSystemDepths?.depthMm !== undefined) return undefined;
  const oursCm = b.calculation.depthCm;
  const planCm = oursCm + ct.ssdDifferenceMm / MM_PER_CM;
  const ratio = f(oursCm) / f(planCm);
  if (!Number.isFinite(ratio) || planCm < 0) return undefined;
  return {
    code: 'ssd-ct-vs-plan',
    contributionPercent: 100 * (ratio - 1),
    confidence: 'estimated',
    evidence: {
      ctSsdCm: (ct.ssdAlongAxisMm ?? 0) / MM_PER_CM,
      planSsdCm: (ct.planSsdMm ?? 0) / MM_PER_CM,
      depthCm: oursCm,
      depthByPlanSsdCm: planCm,
    },
  };
}

/**
 * Without the planning system's Equivalent Depth, its RT Dose's word on heterogeneity against ours:
 * ours corrected through the CT where it says it did not correct (our correction factor is the
 * cause, measured), or ours homogeneous where it says it corrected (named, its share not known).
 */
export function statedHeterogeneityCause(b: CheckedBeam, planningSystemCorrected: boolean | undefined): DeviationCause | undefined {
  if (b.calculation.planningSystemDepths?.equivalentDepthMm !== undefined || planningSystemCorrected === undefined) return undefined;
  const ours = b.calculation.ct?.correctionFactor ?? b.calculation.modulated?.correctionFactor;
  if (ours !== undefined && !planningSystemCorrected)
    return {
      code: 'heterogeneity',
      contributionPercent: 100 * (ours - 1),
      confidence: 'measured',
      evidence: { ourCorrection: ours, planningSystem: 'not corrected, as its RT Dose states' },
    };
  if (ours === undefined && planningSystemCorrected)
    return {
      code: 'heterogeneity',
      contributionPercent: 0,
      estimated: false,
      confidence: 'possible',
      evidence: { ours: 'none (no CT)', planningSystem: 'corrected, as its RT Dose or plan states' },
    };
  return undefined;
}
