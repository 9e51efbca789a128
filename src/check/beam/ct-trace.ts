import { type BeamFrame, type CtDepth, ctDepth, type FlatDepth, projectOnAxis, type Vec3 } from '../../geometry/index.js';
import type { RayDepths } from '../planning-system-depths.js';
import type { Calculation } from '../../model/index.js';
import { ctAxisSsdMm, ctDepthOptions, type PatientCt } from '../patient-ct.js';
import { type BeamCheckContext, type Stopped, stopNotChecked } from './context.js';

/** The ray from the source to the point through the patient's CT, and the SSD along the central axis. */
export interface Traced {
  readonly depth: CtDepth;
  /** Undefined when the central axis meets no body in the CT. */
  readonly axisSsdMm: number | undefined;
}

/**
 * Traces the beam's ray to its point through the CT, its distances projected on the central axis;
 * a ray the CT cannot answer ends the check (not checked, with the geometry's reason).
 */
export function traceToPoint(
  ctx: BeamCheckContext & { ct: PatientCt },
  frame: BeamFrame,
  sadMm: number,
  pointMm: Vec3 = ctx.point.patientMm,
  controlPoint?: number,
): Traced | Stopped {
  const t = ctDepth(ctx.ct.volume, frame.sourcePatientMm, pointMm, ctDepthOptions(ctx.ct));
  if (!t.ok) return stopNotChecked(ctx, 'ct-trace', { ...t.refusal, controlPoint });
  return { depth: projectOnAxis(t.value, frame, pointMm), axisSsdMm: ctAxisSsdMm(ctx.ct, frame, sadMm) };
}

/** What the result says of the CT geometry and the correction, beside the plan's SSD. */
export function ctSummary(
  ct: PatientCt,
  traced: Traced,
  planSsdMm: number | undefined,
  method: NonNullable<Calculation['ct']>['method'],
  correctionFactor: number,
  homogeneousDoseCGy: number,
): NonNullable<Calculation['ct']> {
  const t = traced.depth;
  const axis = traced.axisSsdMm;
  return {
    ...(axis !== undefined ? { ssdAlongAxisMm: axis } : {}),
    ...(axis !== undefined && planSsdMm !== undefined ? { ssdDifferenceMm: axis - planSsdMm } : {}),
    ...(planSsdMm !== undefined ? { planSsdMm } : {}),
    ssdAlongRayMm: t.alongRay?.ssdMm ?? t.ssdMm,
    geometricDepthMm: t.geometricDepthMm,
    radiologicalDepthMm: t.radiologicalDepthMm,
    ...(t.alongRay
      ? {
          alongRay: { cosine: t.alongRay.cosine, geometricDepthMm: t.alongRay.geometricDepthMm, radiologicalDepthMm: t.alongRay.radiologicalDepthMm },
        }
      : {}),
    entryPatientMm: [...t.entryPatientMm] as [number, number, number],
    densityRange: [...t.densityRange] as [number, number],
    ...(t.nearestInterfaceMm !== undefined ? { nearestInterfaceMm: t.nearestInterfaceMm } : {}),
    correctionFactor,
    homogeneousDoseCGy,
    bodyThresholdHu: ct.bodyThresholdHu,
    body: ct.bodySource,
    method,
  };
}

/** Our depths along the ray (to set beside the planning system's): traced through the CT, else below the plan's flat surface at `ssdMm`. */
export function rayDepths(at: FlatDepth, ssdMm: number, traced: Traced | undefined): RayDepths {
  const r = traced?.depth.alongRay;
  if (r) return { depthMm: r.geometricDepthMm, radiologicalMm: r.radiologicalDepthMm, ssdMm: r.ssdMm };
  return { depthMm: at.depthMm / at.rayCosine, ssdMm: ssdMm / at.rayCosine };
}
