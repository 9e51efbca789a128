import type { Beam, PlanningSystemDepths, ReferencedBeam } from '../model/index.js';

/**
 * The planning system's Beam Dose Point Depth, Equivalent Depth and SSD for a beam: the current
 * Beam Dose Verification Control Point Sequence first, else the retired per-beam attributes.
 */
export function planningSystemDepths(beam: Beam, entry: ReferencedBeam): PlanningSystemDepths | undefined {
  const v = beam.doseVerification.flatMap((d) => d.points).find((p) => p.pointDepthMm !== undefined || p.ssdMm !== undefined);
  const depthMm = v?.pointDepthMm ?? entry.pointDepthMm;
  const equivalentDepthMm = v?.equivalentDepthMm ?? entry.equivalentDepthMm;
  const ssdMm = v?.ssdMm ?? entry.pointSsdMm;
  if (depthMm === undefined && equivalentDepthMm === undefined && ssdMm === undefined) return undefined;
  return {
    ...(depthMm !== undefined ? { depthMm } : {}),
    ...(equivalentDepthMm !== undefined ? { equivalentDepthMm } : {}),
    ...(ssdMm !== undefined ? { ssdMm } : {}),
  };
}
