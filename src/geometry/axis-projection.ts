import type { BeamFrame } from './beam-frame.js';
import type { CtDepth } from './ct-depth.js';
import { dot, sub, type Vec3 } from './vector.js';

/**
 * A traced depth as the point-dose formalism means it: the densities are summed along the ray from
 * the source (the path the radiation takes), but the depth, the radiological depth and the SSD are
 * distances along the central axis direction, because the off-axis ratio is measured in a plane at
 * depth and already holds the beam's divergence. Every distance along the ray is multiplied by the
 * cosine of the ray's angle to the central axis; in a flat phantom normal to the beam this gives
 * the flat-water depth exactly. The values along the ray stay in `alongRay` (the planning system's
 * Beam Dose Point Depth is given along the ray).
 */
export function projectOnAxis(traced: CtDepth, frame: BeamFrame, pointPatientMm: Vec3): CtDepth {
  const axialMm = dot(sub(pointPatientMm, frame.sourcePatientMm), frame.directionPatient);
  const cosine = axialMm / traced.sourceToPointMm;
  return {
    ...traced,
    ssdMm: traced.ssdMm * cosine,
    sourceToPointMm: axialMm,
    geometricDepthMm: traced.geometricDepthMm * cosine,
    radiologicalDepthMm: traced.radiologicalDepthMm * cosine,
    ...(traced.nearestInterfaceMm !== undefined ? { nearestInterfaceMm: traced.nearestInterfaceMm * cosine } : {}),
    layers: traced.layers.map((l) => ({ ...l, distanceToPointMm: l.distanceToPointMm * cosine })),
    alongRay: { cosine, ssdMm: traced.ssdMm, geometricDepthMm: traced.geometricDepthMm, radiologicalDepthMm: traced.radiologicalDepthMm },
  };
}
