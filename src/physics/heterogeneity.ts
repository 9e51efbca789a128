import type { LookupNote, Looked, PhotonBeamModel } from '../model/index.js';
import { tprAt } from './beam-factors.js';

/**
 * Heterogeneity correction by the TPR ratio (effective path length) method:
 *   CF = TPR(d_eff, rd) / TPR(d, rd)
 * with d the geometric and d_eff the radiological (water-equivalent) depth, rd the field side at the
 * point's depth. Batho's power law (below) is the refinement for layered media.
 */
export function tprRatioCorrection(beam: PhotonBeamModel, depthCm: number, radiologicalDepthCm: number, sideAtDepthCm: number): Looked<number> {
  const lookups: LookupNote[] = [];
  return { value: tprAt(beam, radiologicalDepthCm, sideAtDepthCm, lookups) / tprAt(beam, depthCm, sideAtDepthCm, lookups), lookups };
}

/** The heterogeneity corrections a check may use. */
export type HeterogeneityMethod = 'tpr-ratio' | 'batho';

/**
 * Batho's power law in its generalized form (Sontag and Cunningham), TPR in place of TAR:
 *   CF = Π_m TPR(X_m, rd)^(ρ_m − ρ_(m−1)),  ρ_0 = 1
 * over the media m met from the surface to the point, X_m the distance from the upper face of
 * medium m to the point (cm). For a point in water below one slab of density ρ2 it is the
 * two-layer form CF = TPR(d3)^(1 − ρ2) / TPR(d2)^(1 − ρ2). The ratio of mass energy-absorption
 * coefficients of the point's medium to water is taken as 1 (a water-like point). Not defined
 * within the build-up distance past an interface: the caller says so.
 */
export function bathoCorrection(
  beam: PhotonBeamModel,
  layers: readonly { readonly distanceToPointCm: number; readonly density: number }[],
  sideAtDepthCm: number,
): Looked<number> {
  const lookups: LookupNote[] = [];
  let lnCf = 0;
  let previous = 1;
  for (const layer of layers) {
    if (layer.density !== previous)
      lnCf += (layer.density - previous) * Math.log(tprAt(beam, Math.max(0, layer.distanceToPointCm), sideAtDepthCm, lookups));
    previous = layer.density;
  }
  return { value: Math.exp(lnCf), lookups };
}
