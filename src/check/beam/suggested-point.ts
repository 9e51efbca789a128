import { type Aperture, type BlockOutline, bldToPatient, ctDepth, fieldEdgeDistanceMm, projectOnAxis, type Vec3 } from '../../geometry/index.js';
import { type CheckedBeam, MM_PER_CM, type PhotonBeamModel } from '../../model/index.js';
import { photonDosePerMu, projectFieldCm } from '../../physics/index.js';
import { fieldInput } from '../field-input.js';
import { heterogeneityCorrection } from '../heterogeneity-correction.js';
import { ctDepthOptions } from '../patient-ct.js';
import type { Policy } from '../policy.js';
import { type BeamCheckContext, isStopped } from './context.js';
import { clampRows } from './dose-comparison.js';
import type { StaticField } from './static-field.js';
import type { Modifiers } from './modifiers.js';
import type { StaticGeometry } from './static-geometry.js';
import { wedgePosition } from './wedge-position.js';

type Suggestion = NonNullable<CheckedBeam['fitness']['suggestion']>;

/**
 * For a point unfit for a point check: a better point at the same depth and, when asked
 * (`--suggest-point`), the independent dose there, with its own sectors and, with the CT, its own
 * traced depth and correction.
 */
export function suggestedPoint(
  ctx: BeamCheckContext,
  data: PhotonBeamModel,
  g: StaticGeometry,
  f: StaticField,
  m: Modifiers,
): { suggestion?: Suggestion; dose?: CheckedBeam['suggestedPoint'] } {
  const s = betterPoint(g.aperture, g.blocks, g, ctx.policy);
  if (!s) return {};
  const suggestion: Suggestion = { patientMm: s.patientMm, depthCm: s.depthCm, offAxisCm: s.offAxisCm, edgeDistanceCm: s.edgeDistanceCm };
  if (!ctx.suggestPoint) return { suggestion };
  const { machine } = ctx;
  const traced = ctx.ct ? ctDepth(ctx.ct.volume, g.frame.sourcePatientMm, s.patientMm, ctDepthOptions(ctx.ct)) : undefined;
  const there = traced?.ok ? { ok: true as const, value: projectOnAxis(traced.value, g.frame, s.patientMm) } : traced;
  const depthThereCm = there?.ok ? there.value.geometricDepthMm / MM_PER_CM : s.depthCm;
  const [sx, sy] = s.atIsocenterPlaneMm;
  // A wedge's profile at the suggested point's own place along the gradient (or no dose there without one).
  const w = wedgePosition(ctx, data, { ...g, at: { ...g.at, atIsocenterPlaneMm: s.atIsocenterPlaneMm } }, m);
  if (isStopped(w)) return { suggestion };
  const { towardHeelCm: _, ...input } = f.input;
  const r = photonDosePerMu(data, machine.sadCm, {
    ...input,
    ...(w.towardHeelCm !== undefined ? { towardHeelCm: w.towardHeelCm } : {}),
    offAxisCm: s.offAxisCm,
    depthCm: depthThereCm,
    ...(there?.ok ? { ssdCm: there.value.ssdMm / MM_PER_CM } : {}),
    ...(f.field.clarksonSectors
      ? { clarksonSectors: fieldInput(g.aperture, g.blocks, sx, sy, f.depthScale, data.mlcTransmission ?? 0).clarksonSectors }
      : {}),
  });
  const cf = there?.ok
    ? heterogeneityCorrection(
        ctx.heterogeneity ?? 'tpr-ratio',
        data,
        there.value,
        projectFieldCm(f.field.irradiatedSquareCm, machine.sadCm, there.value.sourceToPointMm / MM_PER_CM),
      )
    : { value: 1, lookups: [] };
  if (!r.ok || !Number.isFinite(cf.value)) return { suggestion };
  return {
    suggestion,
    dose: {
      patientMm: s.patientMm,
      depthCm: depthThereCm,
      offAxisCm: s.offAxisCm,
      independentDoseCGy: ctx.entry.beamMeterset! * r.value.dosePerMuCGy * cf.value,
      clamps: clampRows([...r.value.clamps, ...cf.lookups]),
    },
  };
}

/** A better point at the same depth: the open field's centroid, or the open point farthest from every edge. */
function betterPoint(aperture: Aperture, blocks: readonly BlockOutline[], g: StaticGeometry, policy: Policy) {
  const distance = (x: number, y: number) => fieldEdgeDistanceMm(aperture, blocks, x, y);
  let [bx, by] = aperture.centroidMm;
  let best = distance(bx, by);
  const scale = g.at.sourceToPointAxialMm / g.sadMm;
  if (best * scale < policy.point.edgeMarginCm * MM_PER_CM) {
    const e = aperture.openExtentMm;
    for (let x = e.x1; x <= e.x2; x += 2) {
      for (let y = e.y1; y <= e.y2; y += 2) {
        const d = distance(x, y);
        if (d > best) [best, bx, by] = [d, x, y];
      }
    }
  }
  if (best <= 0) return undefined;
  const pointBld: Vec3 = [bx * scale, by * scale, g.at.pointBldMm[2]];
  const patientMm = bldToPatient(g.frame, pointBld).map((v) => Math.round(v * 10) / 10) as [number, number, number];
  return {
    patientMm,
    atIsocenterPlaneMm: [bx, by] as const,
    depthCm: (g.at.sourceToPointAxialMm - g.axisSsdMm) / MM_PER_CM,
    offAxisCm: Math.hypot(pointBld[0], pointBld[1]) / MM_PER_CM,
    edgeDistanceCm: (best * scale) / MM_PER_CM,
  };
}
