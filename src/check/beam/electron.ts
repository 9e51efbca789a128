import { findElectronBeam } from '../../beamdata/index.js';
import { beamFrame, flatDepth, insidePolygon, polygonArea, polygonEdgeDistance, type Polygon } from '../../geometry/index.js';
import { type Calculation, type ElectronBeamModel, type ElectronPointResult, MM_PER_CM, note, type Note } from '../../model/index.js';
import { electronDmaxCm, electronDosePerMu } from '../../physics/index.js';
import { besideOurs } from '../planning-system-depths.js';
import { categorize, isHeterogeneous, levelsOf, planningSystemCorrectedBeam } from './category.js';
import { beamIdentity, type BeamCheckContext, type BeamOutcome, isStopped, stopNotChecked, stopRefused } from './context.js';
import { ctSummary, rayDepths, type Traced, traceToPoint } from './ct-trace.js';
import { clampRows, compareDose, factorRows } from './dose-comparison.js';
import { type ElectronField, electronField } from './electron-field.js';
import { edgeFlags, electronDepthFlags } from './point-fitness.js';

/** Beyond dmax, a point where the depth dose has fallen below this lies on its steep fall-off. */

/**
 * One electron beam's independent dose at its point (AAPM TG-71): the applicator and cutout, the
 * depth below the plan's SSD on the central axis (or traced through the CT, with the PDD at the
 * radiological depth), the effective SSD for an air gap.
 */
export function checkElectronBeam(ctx: BeamCheckContext): BeamOutcome {
  const { beam, machine, policy } = ctx;
  const cp0 = beam.controlPoints[0]!;
  const found = findElectronBeam(machine, cp0.nominalEnergyMeV!);
  if (!found.ok) return stopRefused(ctx, found.issues).stopped;
  const data = found.value;
  const sadMm = beam.sourceAxisDistanceMm ?? machine.sadCm * MM_PER_CM;
  const ef = electronField(ctx, data, sadMm);
  if (isStopped(ef)) return ef.stopped;
  if (cp0.ssdMm === undefined && !ctx.ct) return stopNotChecked(ctx, 'no-ssd-no-ct').stopped;
  const frame = beamFrame(cp0, ctx.patientPosition, sadMm)!;
  const at = flatDepth(frame, ctx.point.patientMm, cp0.ssdMm ?? 0);
  const traced = ctx.ct ? traceToPoint({ ...ctx, ct: ctx.ct }, frame, sadMm) : undefined;
  if (traced && isStopped(traced)) return traced.stopped;
  const depthCm = (traced ? traced.depth.geometricDepthMm : at.depthMm) / MM_PER_CM;
  const ssdCm = (traced ? traced.depth.ssdMm : (cp0.ssdMm ?? 0)) / MM_PER_CM;
  const lookupDepthCm = traced ? traced.depth.radiologicalDepthMm / MM_PER_CM : depthCm;
  if (depthCm < 0) return stopNotChecked(ctx, 'point-above-surface', { heightCm: -depthCm }).stopped;
  const input = { applicatorId: ef.applicator.id, field: ef.field, depthCm: lookupDepthCm, ssdCm };
  const r = electronDosePerMu(data, input);
  if (!r.ok) return stopNotChecked(ctx, 'calculation-refused', { message: r.issues.map((i) => i.message).join('; ') }).stopped;
  const mu = ctx.entry.beamMeterset!;
  const ct = traced && ctx.ct ? electronCt(ctx, data, input, traced, r.value.dosePerMuCGy, mu) : undefined;
  if (ct && isStopped(ct)) return ct.stopped;
  const identity = beamIdentity(beam, ctx.entry);
  const dosePerMuCGy = r.value.dosePerMuCGy;
  const offAxisCm = at.offAxisMm / MM_PER_CM;
  const pddPercent = 100 * r.value.factors.find((f) => f.key === 'PDD')!.value;
  const { edgeDistanceCm, openFraction } = cutoutEdge(ef, at);
  const category = categorize(policy, {
    wedged: false,
    offAxisCm,
    irradiatedSquareCm: r.value.fieldSideCm,
    openFraction,
    ssdCm,
    shaped: !!ef.outline && !ef.rectangular,
    heterogeneous: isHeterogeneous(policy, ct?.densityRange, !ctx.ct && planningSystemCorrectedBeam(ctx)),
  });
  const planningSystemDepths = besideOurs(ctx.planningSystemDepths, rayDepths(at, cp0.ssdMm ?? 0, traced));
  const side = ef.applicator.sideCm;
  return {
    ok: true,
    value: {
      ...identity,
      status: 'checked',
      point: ctx.point,
      calculation: {
        machineBeam: `${machine.name} ${data.id}`,
        setup: 'SSD',
        setupBasis: note('electron-applicator', { applicatorId: ef.applicator.id, ssdCm, nominalSsdCm: data.calibration.ssd0Cm }),
        ssdCm,
        depthCm,
        offAxisCm,
        collimatorFieldCm: { x: side, y: side },
        collimatorSquareCm: side,
        irradiatedSquareCm: r.value.fieldSideCm,
        approximations: electronApproximations(ctx, data, ef, r.value, ssdCm, offAxisCm),
        factors: factorRows(r.value.factors),
        dosePerMuCGy,
        ...compareDose(mu, dosePerMuCGy, identity.planningSystemDoseCGy),
        clamps: clampRows(r.value.clamps),
        ...(ct ? { ct } : {}),
        ...(planningSystemDepths ? { planningSystemDepths } : {}),
        electron: {
          applicatorId: ef.applicator.id,
          cutout: ef.outline ? (ef.rectangular ? 'rectangle' : 'shaped') : 'none',
          ...electronParts(r.value),
          pddPercent,
        },
      },
      ...levelsOf(policy, category),
      fitness: {
        edgeDistanceCm,
        flags: [...edgeFlags(edgeDistanceCm, policy), ...electronDepthFlags(lookupDepthCm, electronDmaxCm(data, ef.field), pddPercent)],
      },
    },
  };
}

/** How the cutout was taken and its effective SSD, an extended SSD, an off-axis point, a bolus. */
function electronApproximations(
  ctx: BeamCheckContext,
  data: ElectronBeamModel,
  ef: ElectronField,
  r: ElectronPointResult,
  ssdCm: number,
  offAxisCm: number,
): Note[] {
  return [
    { code: ef.cutout.code, values: { ...ef.cutout.values, effectiveSsdCm: r.effectiveSsdCm } },
    ...(Math.abs(r.airGapCm) > 1e-6 ? [note('electron-extended-ssd', { measuredSsdCm: data.pdd.ssdCm, ssdCm })] : []),
    ...(offAxisCm > 0.5 ? [note('electron-off-axis', { offAxisCm })] : []),
    ...(ctx.beam.bolusRoiNumbers.length ? [note('bolus-depth')] : []),
  ];
}

/** The field side, effective SSD and air gap the electron dose was found with. */
const electronParts = (r: ElectronPointResult) => ({ fieldSideCm: r.fieldSideCm, effectiveSsdCm: r.effectiveSsdCm, airGapCm: r.airGapCm });

/** With the CT: the PDD at the radiological depth against the homogeneous dose at the geometric depth. */
function electronCt(
  ctx: BeamCheckContext,
  data: ElectronBeamModel,
  input: Parameters<typeof electronDosePerMu>[1],
  traced: Traced,
  dosePerMuCGy: number,
  mu: number,
) {
  const homogeneous = electronDosePerMu(data, { ...input, depthCm: traced.depth.geometricDepthMm / MM_PER_CM });
  if (!homogeneous.ok) return stopNotChecked(ctx, 'homogeneous-refused', { message: homogeneous.issues.map((i) => i.message).join('; ') });
  const planSsdMm = ctx.beam.controlPoints[0]!.ssdMm;
  const ct: NonNullable<Calculation['ct']> = ctSummary(
    ctx.ct!,
    traced,
    planSsdMm,
    'electron-radiological-depth',
    dosePerMuCGy / homogeneous.value.dosePerMuCGy,
    mu * homogeneous.value.dosePerMuCGy,
  );
  return ct;
}

/** The point's distance to the cutout's edge (or the applicator's) at its depth, and the open share of the applicator. */
function cutoutEdge(ef: ElectronField, at: ReturnType<typeof flatDepth>): { edgeDistanceCm: number; openFraction: number } {
  const half = (ef.applicator.sideCm * MM_PER_CM) / 2;
  const square: Polygon = [
    [-half, -half],
    [half, -half],
    [half, half],
    [-half, half],
  ];
  const edge = ef.outline ?? square;
  const [px, py] = [at.atIsocenterPlaneMm[0] * ef.toNominal, at.atIsocenterPlaneMm[1] * ef.toNominal];
  const toDepth = at.sourceToPointAxialMm / ef.nominalSsdMm;
  const edgeDistanceCm = ((insidePolygon(edge, px, py) ? 1 : -1) * polygonEdgeDistance(edge, px, py) * toDepth) / MM_PER_CM;
  const openArea = ef.outline ? polygonArea(ef.outline) : (2 * half) ** 2;
  return { edgeDistanceCm, openFraction: openArea / (2 * half) ** 2 };
}
