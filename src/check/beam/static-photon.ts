import { findPhotonBeam } from '../../beamdata/index.js';
import { type CtDepth, DENSITY_STEP, fieldEdgeDistanceMm } from '../../geometry/index.js';
import { type LookupNote, MM_PER_CM, type Note, type PhotonBeamModel } from '../../model/index.js';
import { photonDosePerMu, projectFieldCm } from '../../physics/index.js';
import { bathoNotes, heterogeneityCorrection } from '../heterogeneity-correction.js';
import { besideOurs } from '../planning-system-depths.js';
import { categorize, isHeterogeneous, levelsOf, planningSystemCorrectedBeam } from './category.js';
import { beamIdentity, type BeamCheckContext, type BeamOutcome, isStopped, type Stopped, stopNotChecked, stopRefused } from './context.js';
import { ctSummary, rayDepths } from './ct-trace.js';
import { clampRows, compareDose, factorRows } from './dose-comparison.js';
import { beamModifiers } from './modifiers.js';
import { buildUpFlags, edgeFlags, interfaceFlags } from './point-fitness.js';
import { staticField } from './static-field.js';
import { staticGeometry } from './static-geometry.js';
import { suggestedPoint } from './suggested-point.js';
import { wedgePosition } from './wedge-position.js';

/**
 * A static photon beam's independent dose at its point (AAPM TG-71): the beam data for its energy,
 * its modifiers, its geometry (flat water below the plan's SSD, or traced through the CT), the
 * physics' factors, the heterogeneity correction with the CT, then the point's fitness.
 */
export function checkStaticPhotonBeam(ctx: BeamCheckContext): BeamOutcome {
  const data = photonBeamData(ctx);
  if (isStopped(data)) return data.stopped;
  const modifiers = beamModifiers(ctx, data);
  if (isStopped(modifiers)) return modifiers.stopped;
  const g = staticGeometry(ctx, modifiers, data.dosimetricLeafGapMm ?? 0);
  if (isStopped(g)) return g.stopped;
  const w = wedgePosition(ctx, data, g, modifiers);
  if (isStopped(w)) return w.stopped;
  const f = staticField(ctx, data, g, modifiers, w);
  const r = photonDosePerMu(data, ctx.machine.sadCm, f.input);
  if (!r.ok) return stopNotChecked(ctx, 'calculation-refused', { message: r.issues.map((i) => i.message).join('; ') }).stopped;
  const mu = ctx.entry.beamMeterset!;
  const identity = beamIdentity(ctx.beam, ctx.entry);
  const sideAtDepthCm = projectFieldCm(f.field.irradiatedSquareCm, ctx.machine.sadCm, g.ssdCm + g.depthCm);
  const het = g.traced ? heterogeneity(ctx, data, g.traced.depth, sideAtDepthCm) : { correction: 1, approximations: [], lookups: [] };
  if (isStopped(het)) return het.stopped;
  const ct =
    g.traced && ctx.ct
      ? ctSummary(ctx.ct, g.traced, ctx.beam.controlPoints[0]!.ssdMm, ctx.heterogeneity ?? 'tpr-ratio', het.correction, mu * r.value.dosePerMuCGy)
      : undefined;
  const dosePerMuCGy = r.value.dosePerMuCGy * het.correction;
  const [px, py] = g.at.atIsocenterPlaneMm;
  const edgeDistanceCm = (fieldEdgeDistanceMm(g.aperture, g.blocks, px, py) * f.depthScale) / MM_PER_CM;
  const flags = [
    ...edgeFlags(edgeDistanceCm, ctx.policy),
    ...buildUpFlags(g.depthCm, data.calibration.dmaxCm),
    ...interfaceFlags(ct?.nearestInterfaceMm, ctx.policy),
  ];
  const suggested = flags.length ? suggestedPoint(ctx, data, g, f, modifiers) : undefined;
  const category = categorize(ctx.policy, {
    wedged: !!modifiers.wedgeIn,
    offAxisCm: g.offAxisCm,
    irradiatedSquareCm: f.field.irradiatedSquareCm,
    openFraction: f.field.openAreaMm2 / f.field.jawAreaMm2,
    ssdCm: g.ssdCm,
    shaped: g.aperture.leaves || g.blocks.length > 0,
    heterogeneous: isHeterogeneous(ctx.policy, ct?.densityRange, !ctx.ct && planningSystemCorrectedBeam(ctx)),
  });
  const planningSystemDepths = besideOurs(ctx.planningSystemDepths, rayDepths(g.at, ctx.beam.controlPoints[0]!.ssdMm ?? 0, g.traced));
  return {
    ok: true,
    value: {
      ...identity,
      status: 'checked',
      point: ctx.point,
      calculation: {
        machineBeam: `${ctx.machine.name} ${data.id}`,
        setup: g.setup,
        setupBasis: g.setupBasis,
        ssdCm: g.ssdCm,
        depthCm: g.depthCm,
        offAxisCm: g.offAxisCm,
        collimatorFieldCm: f.field.collimatorFieldCm,
        collimatorSquareCm: r.value.geometry.collimatorSquareCm,
        irradiatedSquareCm: f.field.irradiatedSquareCm,
        ...(modifiers.wedgeIn?.id ? { wedgeId: modifiers.wedgeIn.id } : {}),
        approximations: [...f.approximations, ...het.approximations],
        factors: factorRows(r.value.factors),
        dosePerMuCGy,
        ...compareDose(mu, dosePerMuCGy, identity.planningSystemDoseCGy),
        clamps: clampRows([...r.value.clamps, ...het.lookups]),
        ...(ct ? { ct } : {}),
        ...(planningSystemDepths ? { planningSystemDepths } : {}),
      },
      ...levelsOf(ctx.policy, category),
      fitness: { edgeDistanceCm, flags, ...(suggested?.suggestion ? { suggestion: suggested.suggestion } : {}) },
      ...(suggested?.dose ? { suggestedPoint: suggested.dose } : {}),
    },
  };
}

/** The beam data of the beam's energy, or the input issue that refuses the plan. */
export function photonBeamData(ctx: BeamCheckContext): PhotonBeamModel | Stopped {
  const found = findPhotonBeam(ctx.machine, ctx.beam.controlPoints[0]!.nominalEnergyMeV!);
  return found.ok ? found.value : stopRefused(ctx, found.issues);
}

/** The heterogeneity correction at a traced point by the chosen method, or why it cannot be made. */
function heterogeneity(
  ctx: BeamCheckContext,
  data: PhotonBeamModel,
  t: CtDepth,
  sideAtDepthCm: number,
): { correction: number; approximations: Note[]; lookups: readonly LookupNote[] } | Stopped {
  const method = ctx.heterogeneity ?? 'tpr-ratio';
  const { value: correction, lookups } = heterogeneityCorrection(method, data, t, sideAtDepthCm);
  const approximations = method === 'batho' ? bathoNotes(t, data.calibration.dmaxCm, DENSITY_STEP) : [];
  if (!Number.isFinite(correction))
    return stopNotChecked(ctx, 'heterogeneity-outside-tables', { radiologicalDepthCm: t.radiologicalDepthMm / MM_PER_CM });
  return { correction, approximations, lookups };
}
