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
 * Batho's power law in its generalized form (Sontag and Cunningham), TMR in place of TAR:
 *   CF = Π_m TMR(X_m, rd)^(ρ_m − ρ_(m−1)),  ρ_0 = 1
 * over the media m met from the surface to the point, X_m the distance from the upper face of
 * medium m to the point (cm). For a point in water below one slab of density ρ2 it is the
 * two-layer form CF = TMR(d3)^(1 − ρ2) / TMR(d2)^(1 − ρ2). The exponents add up to ρ_point − 1, so
 * the law depends on the normalisation of the table: it is defined with a ratio normalised at the
 * depth of maximum dose (TAR or TMR), so a TPR normalised at a deeper d0 is renormalised at dmax
 * here, TMR(X) = TPR(X)/TPR(dmax). The ratio of mass energy-absorption coefficients of the point's
 * medium to water is taken as 1 (the caller says so when the point is not in a water-like medium).
 * Not defined within the build-up distance past an interface: the caller says so.
 */
export function bathoCorrection(
  beam: PhotonBeamModel,
  layers: readonly { readonly distanceToPointCm: number; readonly density: number }[],
  sideAtDepthCm: number,
): Looked<number> {
  const lookups: LookupNote[] = [];
  const atDmax = tprAt(beam, beam.calibration.dmaxCm, sideAtDepthCm, lookups);
  let lnCf = 0;
  let previous = 1;
  for (const layer of layers) {
    if (layer.density !== previous) {
      const tmr = tprAt(beam, Math.max(0, layer.distanceToPointCm), sideAtDepthCm, lookups) / atDmax;
      lnCf += (layer.density - previous) * Math.log(tmr);
    }
    previous = layer.density;
  }
  return { value: Math.exp(lnCf), lookups };
}
