import { apertureAt, beamFrame, type CtDepth, ctDepth, fieldEdgeDistanceMm, flatDepth, projectOnAxis } from '../../geometry/index.js';
import { type Factor, type LookupNote, MM_PER_CM, type PhotonBeamModel } from '../../model/index.js';
import { photonDosePerMu, projectFieldCm } from '../../physics/index.js';
import { fieldInput } from '../field-input.js';
import { heterogeneityCorrection } from '../heterogeneity-correction.js';
import { ctAxisSsdMm, ctDepthOptions } from '../patient-ct.js';
import { type BeamCheckContext, type Stopped, stopNotChecked } from './context.js';
import type { Segment } from './segments.js';

/** One segment's dose per MU at the point (before its MU share) and the geometry it was found at. */
export interface SegmentDose {
  /** The segment's share of the beam's MU. */
  readonly share: number;
  /** Homogeneous dose per MU, cGy; times `correction` with the CT. */
  readonly dosePerMuCGy: number;
  readonly correction: number;
  readonly depthCm: number;
  readonly ssdCm: number;
  readonly offAxisCm: number;
  /** The irradiated equivalent square, 0 when the opening has none (all leaves closed). */
  readonly irradiatedSquareCm: number;
  readonly collimatorFieldCm: { readonly x: number; readonly y: number };
  readonly collimatorSquareCm: number;
  /** Distance of the point from the aperture's edge at the isocenter plane, mm, and the scale to the point's depth. */
  readonly edgeDistanceMm: number;
  readonly depthScale: number;
  /** Leaves or jaws cover the point. */
  readonly covered: boolean;
  /** The opening's width along the leaves' travel through the point, at the isocenter plane (0 where covered). */
  readonly openWidthCm: number;
  /** Integrated by Clarkson (else a plain rectangle by its equivalent square). */
  readonly clarkson: boolean;
  readonly radiologicalDepthCm?: number;
  readonly densityRange?: readonly [number, number];
  /** The CT's SSD along the central axis minus the plan's, where the plan states one. */
  readonly ssdDifferenceMm?: number;
  readonly lookups: readonly LookupNote[];
  /** For the audit of the sum: the segment's mid gantry angle, its Sc, the fluence at the point, Sp·TPR and its scatter part (Clarkson). */
  readonly gantryDeg: number;
  readonly sc: number;
  readonly primaryFluence: number;
  readonly spTpr: number;
  readonly scatterSpTpr?: number;
}

/**
 * A segment's dose per MU at the point from its own aperture, gantry angle and depth (the plan's
 * SSD at its control points, or traced through the CT), in the TPR form; a segment the engine
 * cannot calculate ends the beam's check, naming its control points.
 */
export function segmentDose(ctx: BeamCheckContext, data: PhotonBeamModel, s: Segment, sadMm: number): SegmentDose | Stopped {
  const { point, machine } = ctx;
  const controlPoint = s.from;
  const frame = beamFrame(s.mid, ctx.patientPosition, sadMm)!;
  let traced: CtDepth | undefined;
  let ssdDifferenceMm: number | undefined;
  if (ctx.ct) {
    const t = ctDepth(ctx.ct.volume, frame.sourcePatientMm, point.patientMm, ctDepthOptions(ctx.ct));
    if (!t.ok) return stopNotChecked(ctx, 'ct-trace', { ...t.refusal, controlPoint });
    traced = projectOnAxis(t.value, frame, point.patientMm);
    const axis = s.ssdMm !== undefined ? ctAxisSsdMm(ctx.ct, frame, sadMm) : undefined;
    if (axis !== undefined) ssdDifferenceMm = axis - s.ssdMm!;
  } else if (s.ssdMm === undefined) return stopNotChecked(ctx, 'segment-no-ssd', { controlPoint });
  const ssdMm = traced ? traced.ssdMm : s.ssdMm!;
  const at = flatDepth(frame, point.patientMm, ssdMm);
  const depthMm = traced ? traced.geometricDepthMm : at.depthMm;
  if (depthMm < 0) return stopNotChecked(ctx, 'point-above-surface', { heightCm: -depthMm / MM_PER_CM, controlPoint });
  const aperture = apertureAt(ctx.beam, s.mid, data.dosimetricLeafGapMm ?? 0);
  if (!aperture) return stopNotChecked(ctx, 'segment-no-aperture', { controlPoint });
  const depthScale = at.sourceToPointAxialMm / sadMm;
  const [px, py] = at.atIsocenterPlaneMm;
  const field = fieldInput(aperture, [], px, py, depthScale, data.mlcTransmission ?? 0);
  const [depthCm, ssdCm, offAxisCm] = [depthMm / MM_PER_CM, ssdMm / MM_PER_CM, at.offAxisMm / MM_PER_CM];
  const square = Number.isFinite(field.irradiatedSquareCm) && field.irradiatedSquareCm > 0 ? field.irradiatedSquareCm : undefined;
  const r = photonDosePerMu(data, machine.sadCm, {
    setup: 'SAD',
    collimatorFieldCm: field.collimatorFieldCm,
    ...(square ? { irradiatedSquareCm: square } : {}),
    depthCm,
    ssdCm,
    offAxisCm,
    ...(field.clarksonSectors ? { clarksonSectors: field.clarksonSectors, primaryWeight: field.primaryWeight } : {}),
  });
  if (!r.ok) return stopNotChecked(ctx, 'calculation-refused', { message: r.issues.map((i) => i.message).join('; '), controlPoint });
  const lookups = [...r.value.clamps];
  let correction = 1;
  if (traced) {
    const method = ctx.heterogeneity ?? 'tpr-ratio';
    const cf = heterogeneityCorrection(
      method,
      data,
      traced,
      projectFieldCm(square ?? r.value.geometry.collimatorSquareCm, machine.sadCm, ssdCm + depthCm),
    );
    correction = cf.value;
    lookups.push(...cf.lookups);
    if (!Number.isFinite(correction))
      return stopNotChecked(ctx, 'heterogeneity-outside-tables', { radiologicalDepthCm: traced.radiologicalDepthMm / MM_PER_CM, controlPoint });
  }
  return {
    share: s.share,
    dosePerMuCGy: r.value.dosePerMuCGy,
    correction,
    depthCm,
    ssdCm,
    offAxisCm,
    irradiatedSquareCm: square ?? 0,
    collimatorFieldCm: field.collimatorFieldCm,
    collimatorSquareCm: r.value.geometry.collimatorSquareCm,
    edgeDistanceMm: fieldEdgeDistanceMm(aperture, [], px, py),
    depthScale,
    covered: field.primaryWeight < 1,
    openWidthCm: aperture.openWidthMm(px, py) / MM_PER_CM,
    clarkson: !!field.clarksonSectors,
    ...(traced ? { radiologicalDepthCm: traced.radiologicalDepthMm / MM_PER_CM, densityRange: traced.densityRange } : {}),
    ...(ssdDifferenceMm !== undefined ? { ssdDifferenceMm } : {}),
    lookups,
    gantryDeg: s.mid.gantryAngleDeg,
    ...segmentFactors(r.value.factors, field.primaryWeight),
  };
}

/** Sc, Sp·TPR and, with Clarkson, its scatter part Sp(0)·mean SPR, from a segment's factors. */
function segmentFactors(factors: readonly Factor[], primaryFluence: number): Pick<SegmentDose, 'sc' | 'primaryFluence' | 'spTpr' | 'scatterSpTpr'> {
  const value = (key: string) => factors.find((f) => f.key === key)?.value;
  const clarkson = factors.find((f) => f.key === 'SpTPR');
  const sc = value('Sc') ?? Number.NaN;
  if (!clarkson) return { sc, primaryFluence, spTpr: (value('Sp') ?? Number.NaN) * (value('TPR') ?? Number.NaN) };
  // Clarkson's factor carries Sp(0) and TPR(d, 0): the primary part is Sp(0)·fluence·TPR(d, 0).
  const [, , sp0, tpr0] = clarkson.args as number[];
  return { sc, primaryFluence, spTpr: clarkson.value, scatterSpTpr: clarkson.value - sp0! * primaryFluence * tpr0! };
}
