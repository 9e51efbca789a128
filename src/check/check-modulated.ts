import { findPhotonBeam } from '../beamdata/index.js';
import { apertureAt, beamFrame, type CtDepth, ctDepth, fieldEdgeDistanceMm, flatDepth } from '../geometry/index.js';
import { type BeamCheck, type CaseCategory, type ControlPoint, type Factor, type Issue, type LookupNote, MM_PER_CM } from '../model/index.js';
import { photonDosePerMu, projectFieldCm } from '../physics/index.js';
import { heterogeneityCorrection, METHOD_TEXT } from './heterogeneity-correction.js';
import { comparison, isHeterogeneous, levelsOf } from './comparison.js';
import { type BeamCheckContext, beamStub } from './check-beam.js';
import { CLARKSON_SECTORS, fieldInput } from './field-input.js';
import { ctAxisSsdMm, ctDepthOptions } from './patient-ct.js';
import { clampTexts, factorRows } from './calculation-parts.js';


/** One stretch of delivery between two control points, with the MU share it delivers. */
export interface Segment {
  readonly from: number;
  readonly share: number;
  /** The control point in the middle: mean gantry angle and leaf and jaw positions. */
  readonly mid: ControlPoint;
  readonly ssdMm?: number;
}

/**
 * A modulated beam (step-and-shoot, sliding window, VMAT) by the modified Clarkson integration
 * (Kung, Chen and Kuchnir 2000): for every segment between two control points, the point's dose
 * per MU from that segment's own aperture (sector rings with leaf transmission, primary weighed by
 * the fluence at the point), gantry angle and so its own depth, summed with the segment's MU share.
 * Pie sectors with exact ring radii give the same sum as annular sectors over the azimuthally
 * averaged fluence, since each ring's scatter depends on its radius alone. A segment with a plain
 * rectangular opening over the point uses the equivalent square, as a static beam does, so a static
 * field written as an "arc" of identical control points gives the static result.
 */
export function checkModulatedBeam(ctx: BeamCheckContext): { ok: true; value: BeamCheck } | { ok: false; issue: Issue } {
  const { beam, entry, point, machine, policy } = ctx;
  const cps = beam.controlPoints;
  const cp0 = cps[0]!;
  const base: BeamCheck = { ...beamStub(beam, entry), point };
  const notChecked = (reason: string) => ({ ok: true as const, value: { ...base, reason } });
  const found = findPhotonBeam(machine, cp0.nominalEnergyMeV!);
  if (!found.ok) return { ok: false, issue: { ...found.issue, beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}) } };
  const data = found.beam;
  if (beam.blocks.length) return notChecked('a modulated beam with blocks: not supported');
  if (cps.some((c) => c.wedgePositions.some((w) => w.position === 'IN'))) return notChecked('a modulated beam with a wedge in: not supported');
  if (cps.some((c) => c.collimatorAngleDeg !== cp0.collimatorAngleDeg || c.couchAngleDeg !== cp0.couchAngleDeg)) return notChecked('the collimator or the couch turns during the beam: not supported');
  if (cps.some((c) => c.nominalEnergyMeV !== cp0.nominalEnergyMeV)) return notChecked('the energy changes during the beam');
  const sadMm = beam.sourceAxisDistanceMm ?? machine.sadCm * MM_PER_CM;
  if (Math.abs(sadMm - machine.sadCm * MM_PER_CM) > 1) return notChecked(`the beam's SAD (${sadMm} mm) is not the machine's (${machine.sadCm} cm)`);
  const segments = segmentsOf(cps, beam.finalCumulativeMetersetWeight);
  if (!segments.length) return notChecked('no control point delivers any meterset');
  const transmission = data.mlcTransmission ?? 0;
  const ct = ctx.ct;
  const method = ctx.heterogeneity ?? 'tpr-ratio';
  const log: LookupNote[] = [];

  let dosePerMuCGy = 0;
  let homogeneousPerMuCGy = 0;
  const mean = { depthCm: 0, ssdCm: 0, offAxisCm: 0, irradiatedSquareCm: 0, collimatorXCm: 0, collimatorYCm: 0, collimatorSquareCm: 0, edgeDistanceCm: 0 };
  const depths: number[] = [];
  const radiological: number[] = [];
  const densities = [Infinity, -Infinity];
  let coveredShare = 0;
  let clarksonShare = 0;
  let maxSsdDifferenceMm: number | undefined;
  for (const s of segments) {
    const where = `control points ${s.from}–${s.from + 1}`;
    const frame = beamFrame(s.mid, ctx.patientPosition as never, sadMm)!;
    let depthMm: number;
    let ssdMm: number;
    let radiologicalMm: number | undefined;
    let traced: CtDepth | undefined;
    let flat: ReturnType<typeof flatDepth> | undefined;
    if (ct) {
      const t = ctDepth(ct.volume, frame.sourcePatientMm, point.patientMm, ctDepthOptions(ct));
      if (!t.ok) return notChecked(`CT, ${where}: ${t.message}`);
      [depthMm, ssdMm, radiologicalMm] = [t.value.geometricDepthMm, t.value.ssdMm, t.value.radiologicalDepthMm];
      traced = t.value;
      densities[0] = Math.min(densities[0]!, t.value.densityRange[0]);
      densities[1] = Math.max(densities[1]!, t.value.densityRange[1]);
      if (s.ssdMm !== undefined) {
        const axis = ctAxisSsdMm(ct, frame, sadMm);
        if (axis !== undefined && (maxSsdDifferenceMm === undefined || Math.abs(axis - s.ssdMm) > Math.abs(maxSsdDifferenceMm))) maxSsdDifferenceMm = axis - s.ssdMm;
      }
    } else {
      if (s.ssdMm === undefined) return notChecked(`${where}: the plan gives no SSD there and no CT was given, so the depth at that gantry angle cannot be found`);
      ssdMm = s.ssdMm;
      flat = flatDepth(frame, point.patientMm, ssdMm);
      depthMm = flat.depthMm;
    }
    if (depthMm < 0) return notChecked(`${where}: the calculation point lies ${(-depthMm / MM_PER_CM).toFixed(1)} cm above the surface`);
    const at = flat ?? flatDepth(frame, point.patientMm, ssdMm);
    const aperture = apertureAt(beam, s.mid);
    if (!aperture) return notChecked(`${where}: no aperture (no jaws and no leaves along an axis)`);
    const depthScale = at.sourceToPointAxialMm / sadMm;
    const [px, py] = at.atIsocenterPlaneMm;
    const field = fieldInput(aperture, [], px, py, depthScale, transmission);
    const depthCm = depthMm / MM_PER_CM;
    const ssdCm = ssdMm / MM_PER_CM;
    const offAxisCm = at.offAxisMm / MM_PER_CM;
    const square = Number.isFinite(field.irradiatedSquareCm) && field.irradiatedSquareCm > 0 ? field.irradiatedSquareCm : undefined;
    const r = photonDosePerMu(data, machine.sadCm, {
      setup: 'SAD', collimatorFieldCm: field.collimatorFieldCm, ...(square ? { irradiatedSquareCm: square } : {}), depthCm, ssdCm, offAxisCm,
      ...(field.clarksonSectors ? { clarksonSectors: field.clarksonSectors, primaryWeight: field.primaryWeight } : {}),
    });
    if (!r.ok) return notChecked(`${where}: ${r.issues.map((i) => i.message).join('; ')}`);
    log.push(...r.value.clamps);
    let cf = 1;
    if (radiologicalMm !== undefined) {
      cf = heterogeneityCorrection(method, data, traced!, projectFieldCm(square ?? r.value.geometry.collimatorSquareCm, machine.sadCm, ssdCm + depthCm), log);
      if (!Number.isFinite(cf)) return notChecked(`${where}: the heterogeneity correction needs TPR at ${(radiologicalMm / MM_PER_CM).toFixed(2)} cm, outside the tables`);
      radiological.push(radiologicalMm / MM_PER_CM);
    }
    dosePerMuCGy += s.share * r.value.dosePerMuCGy * cf;
    homogeneousPerMuCGy += s.share * r.value.dosePerMuCGy;
    depths.push(depthCm);
    mean.depthCm += s.share * depthCm;
    mean.ssdCm += s.share * ssdCm;
    mean.offAxisCm += s.share * offAxisCm;
    mean.irradiatedSquareCm += s.share * (square ?? 0);
    mean.collimatorXCm += s.share * field.collimatorFieldCm.x;
    mean.collimatorYCm += s.share * field.collimatorFieldCm.y;
    mean.collimatorSquareCm += s.share * r.value.geometry.collimatorSquareCm;
    mean.edgeDistanceCm += (s.share * fieldEdgeDistanceMm(aperture, [], px, py) * depthScale) / MM_PER_CM;
    if (field.primaryWeight < 1) coveredShare += s.share;
    if (field.clarksonSectors) clarksonShare += s.share;
  }

  const mu = entry.beamMeterset!;
  const compared = comparison(mu, dosePerMuCGy, base.planningSystemDoseCGy);
  const d0CGyPerMu = data.calibration.doseCGyPerMu;
  const gantryMoves = cps.some((c) => c.gantryAngleDeg !== cp0.gantryAngleDeg);
  const depthSource = ct ? `traced through the CT (${ct.bodySource}) at each segment's gantry angle` : gantryMoves ? "below a flat surface at each control point's SSD from the plan" : "below a flat surface at the plan's SSD (the gantry does not move)";
  const factors: Factor[] = [
    { key: 'D0', value: d0CGyPerMu, args: [] },
    { key: 'MCI', value: dosePerMuCGy / d0CGyPerMu, args: [segments.length, CLARKSON_SECTORS], name: data.tpr?.kind ?? 'TPR' },
  ];
  const approximations = [
    `modulated beam by modified Clarkson integration (Kung, Chen and Kuchnir 2000): ${segments.length} segments between ${cps.length} control points, each with its own aperture, gantry angle and depth, weighted by its MU share; ${CLARKSON_SECTORS} sectors, leaf transmission ${transmission}`,
    `depths ${depthSource}`,
    ...(radiological.length ? [`heterogeneity corrected per segment by ${METHOD_TEXT[method]}: dose-weighted CF ${(dosePerMuCGy / homogeneousPerMuCGy).toFixed(4)} (homogeneous dose ${(mu * homogeneousPerMuCGy).toFixed(1)} cGy)`] : []),
    'the leaf tongue-and-groove effect and the rounded leaf ends are not modelled',
  ];
  const flags: string[] = [];
  if (coveredShare > 0.5) flags.push(`the point is under the leaves or outside the jaws for ${(100 * coveredShare).toFixed(0)} % of the MU: its dose rests on leaf transmission and penumbra`);
  if (Math.min(...depths) < data.calibration.dmaxCm) flags.push(`the point is in the build-up region at some gantry angles (depth down to ${Math.min(...depths).toFixed(1)} cm, dmax ${data.calibration.dmaxCm} cm)`);
  const heterogeneous = radiological.length > 0 && isHeterogeneous(policy, [densities[0]!, densities[1]!]);
  const category: CaseCategory = heterogeneous && policy.levels.heterogeneous!.actionPercent > policy.levels.modulated!.actionPercent ? 'heterogeneous' : 'modulated';
  const ssdFinding = maxSsdDifferenceMm !== undefined && Math.abs(maxSsdDifferenceMm) > policy.ct.ssdToleranceMm;
  if (ssdFinding) flags.push(`the SSD from the CT differs from the plan's by up to ${maxSsdDifferenceMm!.toFixed(1)} mm at some control point (tolerance ${policy.ct.ssdToleranceMm} mm): bolus missing, wrong CT or wrong isocenter?`);
  return {
    ok: true,
    value: {
      ...base,
      status: 'checked',
      calculation: {
        machineBeam: `${machine.name} ${data.id}`,
        setup: 'SAD',
        setupReason: 'a modulated beam: every segment in the TPR form at the point',
        ssdCm: mean.ssdCm, depthCm: mean.depthCm, offAxisCm: mean.offAxisCm,
        collimatorFieldCm: { x: mean.collimatorXCm, y: mean.collimatorYCm }, collimatorSquareCm: mean.collimatorSquareCm, irradiatedSquareCm: mean.irradiatedSquareCm,
        approximations,
        factors: factorRows(factors),
        dosePerMuCGy,
        ...compared,
        clamps: clampTexts(log),
        modulated: {
          method: 'modified Clarkson integration',
          controlPoints: cps.length,
          segments: segments.length,
          gantryStartDeg: cp0.gantryAngleDeg,
          gantryEndDeg: cps[cps.length - 1]!.gantryAngleDeg,
          depthSource,
          depthRangeCm: [Math.min(...depths), Math.max(...depths)],
          ...(radiological.length ? { radiologicalDepthRangeCm: [Math.min(...radiological), Math.max(...radiological)] as [number, number], correctionFactor: dosePerMuCGy / homogeneousPerMuCGy,
            homogeneousDoseCGy: mu * homogeneousPerMuCGy } : {}),
          ...(maxSsdDifferenceMm !== undefined ? { maxSsdDifferenceMm } : {}),
          pointCoveredMuPercent: 100 * coveredShare,
          clarksonMuPercent: 100 * clarksonShare,
        },
      },
      ...levelsOf(policy, category),
      fitness: { edgeDistanceCm: mean.edgeDistanceCm, flags },
    },
  };
}

/** The segments between consecutive control points that deliver meterset, each with its share of the beam's MU. */
export function segmentsOf(cps: readonly ControlPoint[], finalWeight: number | undefined): Segment[] {
  const total = finalWeight ?? cps[cps.length - 1]!.cumulativeMetersetWeight;
  const gantryMoves = cps.some((c) => c.gantryAngleDeg !== cps[0]!.gantryAngleDeg);
  const out: Segment[] = [];
  for (let i = 0; i + 1 < cps.length; i++) {
    const a = cps[i]!;
    const b = cps[i + 1]!;
    const share = (b.cumulativeMetersetWeight - a.cumulativeMetersetWeight) / total;
    if (!(share > 0)) continue;
    // With the gantry still, the first control point's SSD holds for all; else each its own.
    const ssds = gantryMoves ? [a.ssdMm, b.ssdMm].filter((v): v is number => v !== undefined) : [a.ssdMm ?? cps[0]!.ssdMm].filter((v): v is number => v !== undefined);
    out.push({ from: i, share, mid: midway(a, b), ...(ssds.length ? { ssdMm: ssds.reduce((s, v) => s + v, 0) / ssds.length } : {}) });
  }
  return out;
}

/** The control point halfway between a and b: gantry angle the short way round, devices averaged. */
function midway(a: ControlPoint, b: ControlPoint): ControlPoint {
  const turn = ((((b.gantryAngleDeg - a.gantryAngleDeg) % 360) + 540) % 360) - 180;
  const gantry = (((a.gantryAngleDeg + turn / 2) % 360) + 360) % 360;
  const devices = a.devices.map((d) => {
    const e = b.devices.find((x) => x.type === d.type);
    return e ? { type: d.type, positionsMm: d.positionsMm.map((p, k) => (p + e.positionsMm[k]!) / 2) } : d;
  });
  return { ...a, gantryAngleDeg: gantry, devices };
}
