import type { LookupLog, PhotonBeamModel } from '../model/index.js';
import { tprAt } from './beam-factors.js';

/**
 * Heterogeneity correction by the TPR ratio (effective path length) method:
 *   CF = TPR(d_eff, rd) / TPR(d, rd)
 * with d the geometric and d_eff the radiological (water-equivalent) depth, rd the field side at the
 * point's depth. (Batho's power law is the refinement for layered media; not applied here.)
 */
export function tprRatioCorrection(beam: PhotonBeamModel, depthCm: number, radiologicalDepthCm: number, sideAtDepthCm: number, log: LookupLog): number {
  return tprAt(beam, radiologicalDepthCm, sideAtDepthCm, log) / tprAt(beam, depthCm, sideAtDepthCm, log);
}
