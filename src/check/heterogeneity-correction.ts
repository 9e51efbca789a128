import type { CtDepth } from '../geometry/index.js';
import { type Looked, MM_PER_CM, type Note, note, type PhotonBeamModel } from '../model/index.js';
import { bathoCorrection, type HeterogeneityMethod, tprRatioCorrection } from '../physics/index.js';

/** How each method is named in the result. */
export const METHOD_TEXT: Readonly<Record<HeterogeneityMethod, string>> = {
  'tpr-ratio': 'the TPR ratio (effective path length)',
  batho: "Batho's power law (generalized, TMR form)",
};

/** The heterogeneity correction of a traced point by the chosen method (geometry in mm hands over to cm here). */
export function heterogeneityCorrection(method: HeterogeneityMethod, beam: PhotonBeamModel, traced: CtDepth, sideAtDepthCm: number): Looked<number> {
  if (method === 'batho') {
    return bathoCorrection(
      beam,
      traced.layers.map((l) => ({ distanceToPointCm: l.distanceToPointMm / MM_PER_CM, density: l.density })),
      sideAtDepthCm,
    );
  }
  return tprRatioCorrection(beam, traced.geometricDepthMm / MM_PER_CM, traced.radiologicalDepthMm / MM_PER_CM, sideAtDepthCm);
}

/** Batho's law, its limits said: an interface within the build-up distance of the point, a point not in a water-like medium. */
export function bathoNotes(traced: CtDepth, dmaxCm: number, interfaceStep: number): Note[] {
  const close = interfaceWithinBuildUpMm(traced, dmaxCm);
  const pointDensity = traced.layers[traced.layers.length - 1]?.density ?? 1;
  return [
    ...(close !== undefined ? [note('batho-interface-in-build-up', { distanceCm: close / MM_PER_CM })] : []),
    ...(Math.abs(pointDensity - 1) > interfaceStep ? [note('batho-point-medium', { density: pointDensity })] : []),
  ];
}

/** Batho's law is not defined within the build-up distance past an interface: the nearest such interface, if any (mm). */
export function interfaceWithinBuildUpMm(traced: CtDepth, dmaxCm: number): number | undefined {
  const inner = traced.layers
    .slice(1)
    .map((l) => l.distanceToPointMm)
    .filter((x) => x < dmaxCm * MM_PER_CM);
  return inner.length ? Math.min(...inner) : undefined;
}
