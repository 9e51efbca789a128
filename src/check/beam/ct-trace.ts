import { type BeamFrame, type CtDepth, ctDepth, type Vec3 } from '../../geometry/index.js';
import type { Calculation } from '../../model/index.js';
import { ctAxisSsdMm, ctDepthOptions, type PatientCt } from '../patient-ct.js';
import { type BeamCheckContext, type Stopped, stopNotChecked } from './context.js';

/** The ray from the source to the point through the patient's CT, and the SSD along the central axis. */
export interface Traced {
  readonly depth: CtDepth;
  /** Undefined when the central axis meets no body in the CT. */
  readonly axisSsdMm: number | undefined;
}

/** Traces the beam's ray to its point through the CT; a ray the CT cannot answer ends the check (not checked, with the geometry's reason). */
export function traceToPoint(
  ctx: BeamCheckContext & { ct: PatientCt },
  frame: BeamFrame,
  sadMm: number,
  pointMm: Vec3 = ctx.point.patientMm,
  controlPoint?: number,
): Traced | Stopped {
  const t = ctDepth(ctx.ct.volume, frame.sourcePatientMm, pointMm, ctDepthOptions(ctx.ct));
  if (!t.ok) return stopNotChecked(ctx, 'ct-trace', { ...t.refusal, controlPoint });
  return { depth: t.value, axisSsdMm: ctAxisSsdMm(ctx.ct, frame, sadMm) };
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
    ssdAlongRayMm: t.ssdMm,
    geometricDepthMm: t.geometricDepthMm,
    radiologicalDepthMm: t.radiologicalDepthMm,
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
