import { findPhotonBeam } from '../beamdata/index.js';
import { apertureAt, beamFrame, bldToPatient, flatDepth, type Vec3 } from '../geometry/index.js';
import { factorLabel, type Beam, type BeamCheck, type CalculationPoint, type CaseCategory, type Issue, type MachineModel, type PhotonPointInput, type ReferencedBeam } from '../model/index.js';
import { photonDosePerMu } from '../physics/index.js';

import type { Policy } from './policy.js';

export interface BeamCheckContext {
  readonly beam: Beam;
  readonly entry: ReferencedBeam;
  readonly point: CalculationPoint;
  readonly patientPosition: string;
  readonly machine: MachineModel;
  readonly policy: Policy;
  readonly suggestPoint: boolean;
}

const MM_PER_CM = 10;
const CGY_PER_GY = 100;

/**
 * One beam's independent dose at its calculation point, without CT: geometry in mm from the plan
 * (IEC 61217 frame, flat water below the plan's SSD), handed to the physics in cm once, here.
 * Returns the beam's result before its verdict (which needs the other beams at the same point),
 * or an input issue (missing energy or wedge in the beam data) that refuses the plan.
 */
export function checkBeam(ctx: BeamCheckContext): { ok: true; value: BeamCheck } | { ok: false; issue: Issue } {
  const { beam, entry, point, machine, policy } = ctx;
  const cp0 = beam.controlPoints[0]!;
  const base: BeamCheck = {
    beamNumber: beam.number,
    ...(beam.name ? { beamName: beam.name } : {}),
    radiationType: beam.radiationType,
    ...(cp0.nominalEnergyMeV !== undefined ? { nominalEnergy: cp0.nominalEnergyMeV } : {}),
    status: 'not checked',
    ...(entry.beamMeterset !== undefined ? { plannedMu: entry.beamMeterset } : {}),
    ...(entry.beamDoseGy !== undefined ? { planningSystemDoseCGy: entry.beamDoseGy * CGY_PER_GY } : {}),
    point,
    verdictReasons: [],
  };
  const notChecked = (reason: string) => ({ ok: true as const, value: { ...base, reason } });

  const found = findPhotonBeam(machine, cp0.nominalEnergyMeV!);
  if (!found.ok) return { ok: false, issue: { ...found.issue, beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}) } };
  const data = found.beam;
  const wedge = beam.wedges.find((w) => cp0.wedgePositions.some((p) => p.wedgeNumber === w.number && p.position === 'IN'));
  if (wedge && !data.wedges.some((w) => w.id === wedge.id)) {
    return { ok: false, issue: { severity: 'error', code: 'missing-table', beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}),
      message: `the beam data of ${machine.name} ${data.id} have no wedge "${wedge.id ?? wedge.number}"`, expected: data.wedges.map((w) => w.id).join(', ') || 'no wedges', found: wedge.id ?? String(wedge.number) } };
  }
  const sadMm = beam.sourceAxisDistanceMm ?? machine.sadCm * MM_PER_CM;
  if (Math.abs(sadMm - machine.sadCm * MM_PER_CM) > 1) return notChecked(`the beam's SAD (${sadMm} mm) is not the machine's (${machine.sadCm} cm)`);
  if (cp0.ssdMm === undefined) return notChecked('the plan gives no SSD, so without the CT the depth cannot be found');
  const frame = beamFrame(cp0, ctx.patientPosition as never, sadMm)!;
  const at = flatDepth(frame, point.patientMm, cp0.ssdMm);
  if (at.depthMm < 0) return notChecked(`the calculation point lies ${(-at.depthMm / MM_PER_CM).toFixed(1)} cm above the surface`);
  const aperture = apertureAt(beam, cp0);
  if (!aperture || aperture.areaMm2 <= 0) return notChecked('the beam has no open aperture');

  // Geometry (mm) hands over to physics (cm) here, once.
  // Sc follows the collimating opening: the jaws, or the leaves' extent along an axis without jaws.
  const e = aperture.openExtentMm;
  const j = { x1: aperture.hasJaws.x ? aperture.jawsMm.x1 : e.x1, x2: aperture.hasJaws.x ? aperture.jawsMm.x2 : e.x2,
    y1: aperture.hasJaws.y ? aperture.jawsMm.y1 : e.y1, y2: aperture.hasJaws.y ? aperture.jawsMm.y2 : e.y2 };
  const collimatorFieldCm = { x: (j.x2 - j.x1) / MM_PER_CM, y: (j.y2 - j.y1) / MM_PER_CM };
  const jawAreaMm2 = (j.x2 - j.x1) * (j.y2 - j.y1);
  const irradiatedSquareCm = (4 * aperture.areaMm2) / aperture.perimeterMm / MM_PER_CM;
  const depthCm = at.depthMm / MM_PER_CM;
  const offAxisCm = at.offAxisMm / MM_PER_CM;
  const ssdCm = cp0.ssdMm / MM_PER_CM;
  const setup: 'SSD' | 'SAD' = Math.abs(cp0.ssdMm - sadMm) <= policy.classification.ssdSetupWithinMm ? 'SSD' : 'SAD';
  const setupReason = setup === 'SSD' ? `the SSD (${ssdCm.toFixed(1)} cm) equals the SAD: the isocenter is on the surface` : `the isocenter lies ${((sadMm - cp0.ssdMm) / MM_PER_CM).toFixed(1)} cm deep`;
  const approximations: string[] = [];
  const openFraction = aperture.areaMm2 / jawAreaMm2;
  if (aperture.leaves && openFraction < 0.99) {
    approximations.push(`irregular (MLC-shaped) field approximated by its equivalent square 4A/P = ${irradiatedSquareCm.toFixed(2)} cm; sector integration comes in a later version`);
  }
  if (wedge && offAxisCm > policy.classification.offAxisCm) approximations.push('the wedge factor is the central-axis value; the wedge profile off axis is not applied');
  if (beam.bolusRoiNumbers.length) approximations.push("a bolus is referenced: the depth is taken from the plan's SSD, which must include it");
  if ((cp0.tableTopPitchDeg ?? 0) !== 0 || (cp0.tableTopRollDeg ?? 0) !== 0) approximations.push('table top pitch and roll are ignored');

  const input: PhotonPointInput = {
    setup, collimatorFieldCm, irradiatedSquareCm, depthCm, ssdCm, offAxisCm, ...(wedge?.id ? { wedgeId: wedge.id } : {}),
  };
  const r = photonDosePerMu(data, machine.sadCm, input);
  if (!r.ok) return notChecked(r.issues.map((i) => i.message).join('; '));
  const mu = entry.beamMeterset!;
  const independentDoseCGy = mu * r.value.dosePerMuCGy;
  const tps = base.planningSystemDoseCGy;
  const independentMu = tps !== undefined ? tps / r.value.dosePerMuCGy : undefined;

  // Is the point fit for a point check? Edge distance at the point's depth, build-up region.
  const depthScale = at.sourceToPointAxialMm / sadMm;
  const edgeDistanceCm = (aperture.edgeDistanceMm(at.atIsocenterPlaneMm[0], at.atIsocenterPlaneMm[1]) * depthScale) / MM_PER_CM;
  const flags: string[] = [];
  if (edgeDistanceCm < policy.point.edgeMarginCm) {
    flags.push(edgeDistanceCm < 0 ? `the point lies outside the field (${(-edgeDistanceCm).toFixed(1)} cm beyond its edge)` : `the point is ${edgeDistanceCm.toFixed(1)} cm from the field edge (margin ${policy.point.edgeMarginCm} cm)`);
  }
  if (depthCm < data.calibration.dmaxCm) flags.push(`the point is in the build-up region (${depthCm.toFixed(1)} cm, shallower than dmax ${data.calibration.dmaxCm} cm)`);
  const suggestion = flags.length ? suggest(aperture, at, frame, sadMm, cp0.ssdMm, policy) : undefined;
  let suggestedPoint: BeamCheck['suggestedPoint'];
  if (suggestion && ctx.suggestPoint) {
    const s = photonDosePerMu(data, machine.sadCm, { ...input, offAxisCm: suggestion.offAxisCm, depthCm: suggestion.depthCm });
    if (s.ok) suggestedPoint = { patientMm: suggestion.patientMm, depthCm: suggestion.depthCm, offAxisCm: suggestion.offAxisCm, independentDoseCGy: mu * s.value.dosePerMuCGy };
  }

  const category = categorize(policy, { wedged: !!wedge, offAxisCm, irradiatedSquareCm, openFraction, ssdCm, leaves: aperture.leaves });
  return {
    ok: true,
    value: {
      ...base,
      status: 'checked',
      calculation: {
        machineBeam: `${machine.name} ${data.id}`,
        setup,
        setupReason,
        ssdCm,
        depthCm,
        offAxisCm,
        collimatorFieldCm,
        collimatorSquareCm: r.value.geometry.collimatorSquareCm,
        irradiatedSquareCm,
        ...(wedge?.id ? { wedgeId: wedge.id } : {}),
        approximations,
        factors: r.value.factors.map((f) => ({ ...f, args: [...f.args], label: factorLabel(f) })),
        dosePerMuCGy: r.value.dosePerMuCGy,
        independentDoseCGy,
        ...(independentMu !== undefined ? { independentMu } : {}),
        ...(tps !== undefined && tps > 0 ? { doseDeviationPercent: (100 * (independentDoseCGy - tps)) / tps } : {}),
        ...(independentMu !== undefined ? { muDeviationPercent: (100 * (independentMu - mu)) / mu } : {}),
        clamps: r.value.clamps.map((n) => `${n.table}: ${n.axis} ${n.requested.toFixed(2)} ${n.unit} clamped to ${n.used} ${n.unit}`),
      },
      category,
      tolerancePercent: policy.levels[category]!.tolerancePercent,
      actionPercent: policy.levels[category]!.actionPercent,
      fitness: { edgeDistanceCm, flags, ...(suggestion ? { suggestion } : {}) },
      ...(suggestedPoint ? { suggestedPoint } : {}),
    },
  };
}

/** The most demanding category that applies (the one with the widest action level). */
function categorize(policy: Policy, c: { wedged: boolean; offAxisCm: number; irradiatedSquareCm: number; openFraction: number; ssdCm: number; leaves: boolean }): CaseCategory {
  const cls = policy.classification;
  const applicable: CaseCategory[] = ['on-axis-open'];
  if (c.wedged || c.offAxisCm > cls.offAxisCm) applicable.push('off-axis-or-wedged');
  if (c.irradiatedSquareCm < cls.smallFieldCm || (c.leaves && c.openFraction < cls.openFractionBelow)) applicable.push('irregular-or-small');
  if (c.ssdCm > cls.largeSsdCm) applicable.push('large-ssd');
  return applicable.reduce((a, b) => (policy.levels[b]!.actionPercent > policy.levels[a]!.actionPercent ? b : a));
}

/** A better point at the same depth: the aperture's centroid, or the open point farthest from every edge. */
function suggest(aperture: NonNullable<ReturnType<typeof apertureAt>>, at: ReturnType<typeof flatDepth>, frame: ReturnType<typeof beamFrame> & object,
  sadMm: number, ssdMm: number, policy: Policy) {
  let [bx, by] = aperture.centroidMm;
  let best = aperture.edgeDistanceMm(bx, by);
  const scale = at.sourceToPointAxialMm / sadMm;
  if (best * scale < policy.point.edgeMarginCm * MM_PER_CM) {
    const j = aperture.openExtentMm;
    const [x0, x1, y0, y1] = [j.x1, j.x2, j.y1, j.y2];
    for (let x = x0; x <= x1; x += 2) {
      for (let y = y0; y <= y1; y += 2) {
        const d = aperture.edgeDistanceMm(x, y);
        if (d > best) [best, bx, by] = [d, x, y];
      }
    }
  }
  if (best <= 0) return undefined;
  const pointBld: Vec3 = [bx * scale, by * scale, at.pointBldMm[2]];
  const patientMm = bldToPatient(frame, pointBld).map((v) => Math.round(v * 10) / 10) as [number, number, number];
  return { patientMm, depthCm: (at.sourceToPointAxialMm - ssdMm) / MM_PER_CM, offAxisCm: Math.hypot(pointBld[0], pointBld[1]) / MM_PER_CM, edgeDistanceCm: (best * scale) / MM_PER_CM };
}

