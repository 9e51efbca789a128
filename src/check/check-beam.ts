import { findPhotonBeam } from '../beamdata/index.js';
import { type Aperture, apertureAt, beamFrame, bldToPatient, type BlockOutline, ctDepth, fieldEdgeDistanceMm, flatDepth, pointIsOpen, type Vec3 } from '../geometry/index.js';
import { cGyFromGy, type Beam, type BeamCheck, type ControlPoint, type CalculationPoint, type CaseCategory, type Issue, type LookupNote, type MachineModel, type PhotonPointInput, type PlanningSystemDepths, type ReferencedBeam, MM_PER_CM } from '../model/index.js';
import { type HeterogeneityMethod, photonDosePerMu, projectFieldCm } from '../physics/index.js';
import { heterogeneityCorrection, interfaceWithinBuildUpMm, METHOD_TEXT } from './heterogeneity-correction.js';
import { comparison, isHeterogeneous, levelsOf } from './comparison.js';
import { CLARKSON_SECTORS, fieldInput } from './field-input.js';
import { ctAxisSsdMm, ctDepthOptions, type PatientCt } from './patient-ct.js';
import type { Policy } from './policy.js';
import { clampTexts, factorRows } from './calculation-parts.js';
import { besideOurs } from './planning-system-depths.js';

export interface BeamCheckContext {
  readonly beam: Beam;
  readonly entry: ReferencedBeam;
  readonly point: CalculationPoint;
  readonly patientPosition: string;
  readonly machine: MachineModel;
  readonly policy: Policy;
  readonly suggestPoint: boolean;
  /** The patient's CT, when given: depths and SSD traced through it, heterogeneity corrected. */
  readonly ct?: PatientCt;
  /** How photon doses are corrected for heterogeneity with the CT (default: the TPR ratio). */
  readonly heterogeneity?: HeterogeneityMethod;
  /** The planning system's own depths at this point, when the plan carries them (see planning-system-depths.ts). */
  readonly planningSystemDepths?: PlanningSystemDepths | undefined;
}


/**
 * One beam's independent dose at its calculation point, without CT: geometry in mm from the plan
 * (IEC 61217 frame, flat water below the plan's SSD), handed to the physics in cm once, here.
 * Returns the beam's result before its verdict (which needs the other beams at the same point),
 * or an input issue (missing energy or wedge in the beam data) that refuses the plan.
 */
export function checkBeam(ctx: BeamCheckContext): { ok: true; value: BeamCheck } | { ok: false; issue: Issue } {
  const { beam, entry, point, machine, policy } = ctx;
  const method = ctx.heterogeneity ?? 'tpr-ratio';
  const cp0 = beam.controlPoints[0]!;
  const base: BeamCheck = { ...beamStub(beam, entry), point };
  const notChecked = (reason: string) => ({ ok: true as const, value: { ...base, reason } });

  const found = findPhotonBeam(machine, cp0.nominalEnergyMeV!);
  if (!found.ok) return { ok: false, issue: { ...found.issue, beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}) } };
  const data = found.beam;
  const wedgeIn = beam.wedges.find((w) => cp0.wedgePositions.some((p) => p.wedgeNumber === w.number && p.position === 'IN'));
  // A jaw-swept wedge has its own table (by angle); a physical one is looked up by its ID.
  const swept = wedgeIn?.type === 'DYNAMIC' ? wedgeIn : undefined;
  const wedge = swept ? undefined : wedgeIn;
  if (swept && !data.sweptWedge) {
    return { ok: false, issue: { severity: 'error', code: 'missing-table', beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}),
      message: `the beam data of ${machine.name} ${data.id} have no swept-wedge table for the dynamic wedge "${swept.id ?? swept.number}"`, expected: 'a sweptWedge table', found: 'none' } };
  }
  if (swept && (swept.angleDeg === undefined || sweepAxis(swept.orientationDeg) === undefined)) {
    return notChecked(`the dynamic wedge gives ${swept.angleDeg === undefined ? 'no angle' : `orientation ${swept.orientationDeg ?? '(none)'}°, not along a jaw axis`}`);
  }
  if (wedge && !data.wedges.some((w) => w.id === wedge.id)) {
    return { ok: false, issue: { severity: 'error', code: 'missing-table', beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}),
      message: `the beam data of ${machine.name} ${data.id} have no wedge "${wedge.id ?? wedge.number}"`, expected: data.wedges.map((w) => w.id).join(', ') || 'no wedges', found: wedge.id ?? String(wedge.number) } };
  }
  const sadMm = beam.sourceAxisDistanceMm ?? machine.sadCm * MM_PER_CM;
  if (Math.abs(sadMm - machine.sadCm * MM_PER_CM) > 1) return notChecked(`the beam's SAD (${sadMm} mm) is not the machine's (${machine.sadCm} cm)`);
  if (cp0.ssdMm === undefined && !ctx.ct) return notChecked('the plan gives no SSD, so without the CT the depth cannot be found');
  const frame = beamFrame(cp0, ctx.patientPosition as never, sadMm)!;
  const at = flatDepth(frame, point.patientMm, cp0.ssdMm ?? 0);
  if (!ctx.ct && at.depthMm < 0) return notChecked(`the calculation point lies ${(-at.depthMm / MM_PER_CM).toFixed(1)} cm above the surface`);
  // A swept wedge's jaw moves during delivery: the field is the jaws' envelope over the control points.
  const aperture = apertureAt(beam, swept ? jawEnvelope(beam) : cp0);
  if (!aperture || aperture.areaMm2 <= 0) return notChecked('the beam has no open aperture');

  // With the CT: SSD and depth along the ray to the point, traced through the patient.
  let traced: ReturnType<typeof ctDepth> | undefined;
  let ssdAlongAxisMm: number | undefined;
  if (ctx.ct) {
    traced = ctDepth(ctx.ct.volume, frame.sourcePatientMm, point.patientMm, ctDepthOptions(ctx.ct));
    if (!traced.ok) return notChecked(`CT: ${traced.message}`);
    ssdAlongAxisMm = ctAxisSsdMm(ctx.ct, frame, sadMm);
  }
  const depthCm = (traced?.ok ? traced.value.geometricDepthMm : at.depthMm) / MM_PER_CM;
  const offAxisCm = at.offAxisMm / MM_PER_CM;
  const ssdCm = (traced?.ok ? traced.value.ssdMm : cp0.ssdMm!) / MM_PER_CM;
  const axisSsdMm = ssdAlongAxisMm ?? cp0.ssdMm;
  if (axisSsdMm === undefined) return notChecked('the central axis meets no body voxel in the CT and the plan gives no SSD');
  const setup: 'SSD' | 'SAD' = Math.abs(axisSsdMm - sadMm) <= policy.classification.ssdSetupWithinMm ? 'SSD' : 'SAD';
  const setupReason = setup === 'SSD' ? `the SSD (${(axisSsdMm / MM_PER_CM).toFixed(1)} cm) equals the SAD: the isocenter is on the surface` : `the isocenter lies ${((sadMm - axisSsdMm) / MM_PER_CM).toFixed(1)} cm deep`;
  const approximations: string[] = [];
  const blocks: BlockOutline[] = beam.blocks.map((b) => ({ kind: b.type, outlineMm: b.outlineMm, transmission: b.transmission ?? 0 }));
  const [px, py] = at.atIsocenterPlaneMm;
  if (blocks.length && !pointIsOpen(aperture, blocks, px, py)) return notChecked('the calculation point lies under a block or the leaves: choose a point in the open field');
  // Geometry (mm) hands over to physics (cm) in fieldInput, once; irregular fields get Clarkson rings around the point, radii scaled to its depth.
  const depthScale = at.sourceToPointAxialMm / sadMm;
  const field = fieldInput(aperture, blocks, px, py, depthScale, data.mlcTransmission ?? 0);
  const { collimatorFieldCm, irradiatedSquareCm } = field;
  const clarksonSectors = field.clarksonSectors;
  const openFraction = field.openAreaMm2 / field.jawAreaMm2;
  if (clarksonSectors && setup === 'SSD') {
    approximations.push('SSD setup of an irregular field: calculated in the TPR form at the point (SPD = SSD + d), which equals the PDD form for consistent beam data');
  }
  if (clarksonSectors) {
    approximations.push(`irregular field (${[aperture.leaves && aperture.areaMm2 / field.jawAreaMm2 < 0.99 ? 'MLC' : '', blocks.length ? `${blocks.length} block(s)` : ''].filter(Boolean).join(' and ')}) by Clarkson integration over ${CLARKSON_SECTORS} sectors; leaf transmission ${data.mlcTransmission ?? 0}${blocks.length ? `, block transmission as the plan states (${blocks.map((b) => b.transmission).join(', ')})` : ''}`);
  }
  const tray = blocks.length ? beam.blocks[0]!.trayId : undefined;
  if (tray !== undefined && !data.trays.some((t) => t.id === tray)) {
    return { ok: false, issue: { severity: 'error', code: 'missing-table', beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}),
      message: `the beam data of ${machine.name} ${data.id} have no tray "${tray}"`, expected: data.trays.map((t) => t.id).join(', ') || 'no trays', found: tray } };
  }
  const wedgeData = wedge ? data.wedges.find((w) => w.id === wedge.id) : undefined;
  const heel = wedgeData?.profile ? heelDirection(machine, wedge!.orientationDeg) : undefined;
  const towardHeelCm = heel ? (px * heel[0] + py * heel[1]) / MM_PER_CM : undefined;
  if (wedgeData?.profile && !heel) approximations.push(`the wedge profile is not applied: orientation ${wedge!.orientationDeg ?? '(none)'}° is not 0, 90, 180 or 270, or the beam data do not say where the heel points`);
  if (wedge && !heel && offAxisCm > policy.classification.offAxisCm) approximations.push('the wedge factor is the central-axis value; the wedge profile off axis is not applied');
  let sweptWedge: PhotonPointInput['sweptWedge'];
  if (swept) {
    const axis = sweepAxis(swept.orientationDeg)!;
    sweptWedge = { angleDeg: swept.angleDeg!, fieldLengthCm: axis === 'Y' ? collimatorFieldCm.y : collimatorFieldCm.x };
    const j = aperture.jawsMm;
    if (Math.abs(axis === 'Y' ? j.y1 + j.y2 : j.x1 + j.x2) > 1) approximations.push('the swept-wedge factor is for a field centred on the axis; this one is asymmetric along the sweep');
  }
  if (beam.bolusRoiNumbers.length) approximations.push("a bolus is referenced: the depth is taken from the plan's SSD, which must include it");
  if ((cp0.tableTopPitchDeg ?? 0) !== 0 || (cp0.tableTopRollDeg ?? 0) !== 0) approximations.push('table top pitch and roll are ignored');

  const input: PhotonPointInput = {
    // Clarkson integrates Sp·TPR, so irregular fields use the TPR form whatever the setup.
    setup: clarksonSectors ? 'SAD' : setup, collimatorFieldCm, irradiatedSquareCm, depthCm, ssdCm, offAxisCm, ...(wedge?.id ? { wedgeId: wedge.id } : {}),
    ...(towardHeelCm !== undefined ? { towardHeelCm } : {}), ...(sweptWedge ? { sweptWedge } : {}),
    ...(clarksonSectors ? { clarksonSectors, primaryWeight: field.primaryWeight } : {}),
    ...(tray !== undefined ? { trayId: tray } : {}),
  };
  const r = photonDosePerMu(data, machine.sadCm, input);
  if (!r.ok) return notChecked(r.issues.map((i) => i.message).join('; '));
  const mu = entry.beamMeterset!;
  let correction = 1;
  let ctResult: NonNullable<BeamCheck['calculation']>['ct'];
  if (traced?.ok && ctx.ct) {
    const t = traced.value;
    const log: LookupNote[] = [];
    correction = heterogeneityCorrection(method, data, t, projectFieldCm(irradiatedSquareCm, machine.sadCm, ssdCm + depthCm), log);
    const close = method === 'batho' ? interfaceWithinBuildUpMm(t, data.calibration.dmaxCm) : undefined;
    if (close !== undefined) approximations.push(`an interface ${(close / MM_PER_CM).toFixed(1)} cm upstream of the point, within dmax: Batho's law is not defined there`);
    if (!Number.isFinite(correction)) return notChecked(`the heterogeneity correction needs TPR at ${(t.radiologicalDepthMm / MM_PER_CM).toFixed(2)} cm, outside the tables`);
    ctResult = {
      ...(ssdAlongAxisMm !== undefined ? { ssdAlongAxisMm } : {}),
      ...(ssdAlongAxisMm !== undefined && cp0.ssdMm !== undefined ? { ssdDifferenceMm: ssdAlongAxisMm - cp0.ssdMm } : {}),
      ...(cp0.ssdMm !== undefined ? { planSsdMm: cp0.ssdMm } : {}), ssdAlongRayMm: t.ssdMm, geometricDepthMm: t.geometricDepthMm, radiologicalDepthMm: t.radiologicalDepthMm,
      entryPatientMm: [...t.entryPatientMm] as [number, number, number], densityRange: [...t.densityRange] as [number, number],
      ...(t.nearestInterfaceMm !== undefined ? { nearestInterfaceMm: t.nearestInterfaceMm } : {}),
      correctionFactor: correction, homogeneousDoseCGy: mu * r.value.dosePerMuCGy, bodyThresholdHu: ctx.ct.bodyThresholdHu, body: ctx.ct.bodySource, method: METHOD_TEXT[method],
    };
  }
  const dosePerMuCGy = r.value.dosePerMuCGy * correction;
  const compared = comparison(mu, dosePerMuCGy, base.planningSystemDoseCGy);

  // Is the point fit for a point check? Edge distance at the point's depth, build-up region.
  const edgeDistanceCm = (fieldEdgeDistanceMm(aperture, blocks, px, py) * depthScale) / MM_PER_CM;
  const flags: string[] = [];
  if (edgeDistanceCm < policy.point.edgeMarginCm) {
    flags.push(edgeDistanceCm < 0 ? `the point lies outside the field (${(-edgeDistanceCm).toFixed(1)} cm beyond its edge)` : `the point is ${edgeDistanceCm.toFixed(1)} cm from the field edge (margin ${policy.point.edgeMarginCm} cm)`);
  }
  if (depthCm < data.calibration.dmaxCm) flags.push(`the point is in the build-up region (${depthCm.toFixed(1)} cm, shallower than dmax ${data.calibration.dmaxCm} cm)`);
  if (ctResult?.nearestInterfaceMm !== undefined && ctResult.nearestInterfaceMm < policy.point.interfaceMarginCm * MM_PER_CM) {
    flags.push(`the point is ${(ctResult.nearestInterfaceMm / MM_PER_CM).toFixed(1)} cm past a density interface along the ray (margin ${policy.point.interfaceMarginCm} cm)`);
  }
  const suggestion = flags.length ? suggest(aperture, blocks, at, frame, sadMm, axisSsdMm, policy) : undefined;
  let suggestedPoint: BeamCheck['suggestedPoint'];
  if (suggestion && ctx.suggestPoint) {
    // The suggested point gets its own sectors and, with the CT, its own traced depth and correction.
    const there = ctx.ct ? ctDepth(ctx.ct.volume, frame.sourcePatientMm, suggestion.patientMm, ctDepthOptions(ctx.ct)) : undefined;
    const depthThereCm = there?.ok ? there.value.geometricDepthMm / MM_PER_CM : suggestion.depthCm;
    const s = photonDosePerMu(data, machine.sadCm, { ...input, offAxisCm: suggestion.offAxisCm, depthCm: depthThereCm,
      ...(there?.ok ? { ssdCm: there.value.ssdMm / MM_PER_CM } : {}),
      ...(clarksonSectors ? { clarksonSectors: fieldInput(aperture, blocks, suggestion.atIsocenterPlaneMm[0], suggestion.atIsocenterPlaneMm[1], depthScale, data.mlcTransmission ?? 0).clarksonSectors } : {}) });
    const cf = there?.ok ? heterogeneityCorrection(method, data, there.value, projectFieldCm(irradiatedSquareCm, machine.sadCm, there.value.sourceToPointMm / MM_PER_CM), []) : 1;
    if (s.ok && Number.isFinite(cf)) {
      suggestedPoint = { patientMm: suggestion.patientMm, depthCm: depthThereCm, offAxisCm: suggestion.offAxisCm, independentDoseCGy: mu * s.value.dosePerMuCGy * cf };
    }
  }

  const heterogeneous = isHeterogeneous(policy, ctResult?.densityRange);
  const category = categorize(policy, { wedged: !!wedgeIn, offAxisCm, irradiatedSquareCm, openFraction, ssdCm, shaped: aperture.leaves || blocks.length > 0, heterogeneous });
  const planningSystemDepths = besideOurs(ctx.planningSystemDepths, depthCm * MM_PER_CM, ctResult?.radiologicalDepthMm, ssdCm * MM_PER_CM);
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
        ...(wedgeIn?.id ? { wedgeId: wedgeIn.id } : {}),
        approximations,
        factors: factorRows(r.value.factors),
        dosePerMuCGy,
        ...compared,
        clamps: clampTexts(r.value.clamps),
        ...(ctResult ? { ct: ctResult } : {}),
        ...(planningSystemDepths ? { planningSystemDepths } : {}),
      },
      ...levelsOf(policy, category),
      fitness: { edgeDistanceCm, flags, ...(suggestion ? { suggestion: { patientMm: suggestion.patientMm, depthCm: suggestion.depthCm, offAxisCm: suggestion.offAxisCm, edgeDistanceCm: suggestion.edgeDistanceCm } } : {}) },
      ...(suggestedPoint ? { suggestedPoint } : {}),
    },
  };
}

/** The jaw axis a dynamic wedge sweeps along: its orientation 0/180 along Y, 90/270 along X. */
function sweepAxis(orientationDeg: number | undefined): 'X' | 'Y' | undefined {
  if (orientationDeg === undefined) return undefined;
  const o = ((orientationDeg % 360) + 360) % 360;
  return [0, 180].some((a) => Math.abs(o - a) < 0.5) ? 'Y' : [90, 270].some((a) => Math.abs(o - a) < 0.5) ? 'X' : undefined;
}

/** The heel's direction (unit, BEAM LIMITING DEVICE frame) at a wedge orientation, from the beam data's convention. */
function heelDirection(machine: MachineModel, orientationDeg: number | undefined): [number, number] | undefined {
  if (!machine.wedgeHeel || orientationDeg === undefined) return undefined;
  const o = ((orientationDeg % 360) + 360) % 360;
  const y = machine.wedgeHeel.atOrientation0 === '+Y' ? 1 : -1;
  const x = machine.wedgeHeel.atOrientation90 === '+X' ? 1 : -1;
  const near = (a: number) => Math.abs(o - a) < 0.5 || Math.abs(o - a - 360) < 0.5;
  return near(0) ? [0, y] : near(180) ? [0, -y] : near(90) ? [x, 0] : near(270) ? [-x, 0] : undefined;
}

/** The first control point with each jaw at its widest over the beam (a swept wedge's full field). */
function jawEnvelope(beam: Beam): ControlPoint {
  const cps = beam.controlPoints;
  const jaw = (t: string) => t === 'X' || t === 'Y' || t === 'ASYMX' || t === 'ASYMY';
  const devices = cps[0]!.devices.map((d) => {
    if (!jaw(d.type)) return d;
    const all = cps.map((c) => c.devices.find((x) => x.type === d.type)?.positionsMm ?? d.positionsMm);
    return { type: d.type, positionsMm: [Math.min(...all.map((p) => p[0]!)), Math.max(...all.map((p) => p[1]!))] };
  });
  return { ...cps[0]!, devices };
}

/** What the plan says of a beam, before any calculation: the result of a beam not checked, plus its reason. */
export function beamStub(beam: Beam, entry: ReferencedBeam): BeamCheck {
  const energy = beam.controlPoints[0]?.nominalEnergyMeV;
  return {
    beamNumber: beam.number,
    ...(beam.name ? { beamName: beam.name } : {}),
    radiationType: beam.radiationType,
    ...(energy !== undefined ? { nominalEnergy: energy } : {}),
    status: 'not checked',
    ...(entry.beamMeterset !== undefined ? { plannedMu: entry.beamMeterset } : {}),
    ...(entry.beamDoseGy !== undefined ? { planningSystemDoseCGy: cGyFromGy(entry.beamDoseGy) } : {}),
    verdictReasons: [],
  };
}

/** The most demanding category that applies (the one with the widest action level). */
export function categorize(policy: Policy, c: { wedged: boolean; offAxisCm: number; irradiatedSquareCm: number; openFraction: number; ssdCm: number; shaped: boolean; heterogeneous: boolean }): CaseCategory {
  const cls = policy.classification;
  const applicable: CaseCategory[] = ['on-axis-open'];
  if (c.wedged || c.offAxisCm > cls.offAxisCm) applicable.push('off-axis-or-wedged');
  if (c.irradiatedSquareCm < cls.smallFieldCm || (c.shaped && c.openFraction < cls.openFractionBelow)) applicable.push('irregular-or-small');
  if (c.ssdCm > cls.largeSsdCm) applicable.push('large-ssd');
  if (c.heterogeneous) applicable.push('heterogeneous');
  return applicable.reduce((a, b) => (policy.levels[b]!.actionPercent > policy.levels[a]!.actionPercent ? b : a));
}

/** A better point at the same depth: the open field's centroid, or the open point farthest from every edge. */
function suggest(aperture: Aperture, blocks: readonly BlockOutline[], at: ReturnType<typeof flatDepth>, frame: NonNullable<ReturnType<typeof beamFrame>>,
  sadMm: number, ssdMm: number, policy: Policy) {
  const distance = (x: number, y: number) => fieldEdgeDistanceMm(aperture, blocks, x, y);
  let [bx, by] = aperture.centroidMm;
  let best = distance(bx, by);
  const scale = at.sourceToPointAxialMm / sadMm;
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
  const pointBld: Vec3 = [bx * scale, by * scale, at.pointBldMm[2]];
  const patientMm = bldToPatient(frame, pointBld).map((v) => Math.round(v * 10) / 10) as [number, number, number];
  return { patientMm, atIsocenterPlaneMm: [bx, by] as const, depthCm: (at.sourceToPointAxialMm - ssdMm) / MM_PER_CM,
    offAxisCm: Math.hypot(pointBld[0], pointBld[1]) / MM_PER_CM, edgeDistanceCm: (best * scale) / MM_PER_CM };
}
