import { findElectronBeam } from '../beamdata/index.js';
import { axisAlignedRectangle, beamFrame, ctDepth, flatDepth, insidePolygon, polygonArea, polygonEdgeDistance, type Polygon } from '../geometry/index.js';
import { type BeamCheck, type ElectronPointInput, type Issue, MM_PER_CM } from '../model/index.js';
import { electronDmaxCm, electronDosePerMu } from '../physics/index.js';
import { comparison, isHeterogeneous, levelsOf } from './comparison.js';
import { type BeamCheckContext, beamStub, categorize } from './check-beam.js';
import { ctAxisSsdMm, ctDepthOptions } from './patient-ct.js';
import { clampTexts, factorRows } from './calculation-parts.js';
import { besideOurs } from './planning-system-depths.js';

/** Beyond dmax, a point where the depth dose has fallen below this lies on its steep fall-off. */
const FALL_OFF_PERCENT = 80;

/**
 * One electron beam's independent dose at its point (AAPM TG-71): the applicator from the plan, the
 * cutout (the beam's APERTURE block) as a rectangle (square-root rule) or by its equal-area square,
 * the depth below the plan's SSD on the central axis (or traced through the CT, with the PDD at the
 * radiological depth), the effective SSD for an air gap. Returns the result before its verdict, or
 * an input issue (energy or applicator missing from the beam data).
 */
export function checkElectronBeam(ctx: BeamCheckContext): { ok: true; value: BeamCheck } | { ok: false; issue: Issue } {
  const { beam, entry, point, machine, policy } = ctx;
  const cp0 = beam.controlPoints[0]!;
  const base: BeamCheck = { ...beamStub(beam, entry), point };
  const notChecked = (reason: string) => ({ ok: true as const, value: { ...base, reason } });
  const named = { beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}) };
  const found = findElectronBeam(machine, cp0.nominalEnergyMeV!);
  if (!found.ok) return { ok: false, issue: { ...found.issue, ...named } };
  const data = found.beam;
  const applicatorId = beam.applicators[0]?.id;
  if (applicatorId === undefined) return notChecked('an electron beam without an applicator in the plan');
  const applicator = data.applicators.find((a) => a.id === applicatorId);
  if (!applicator) {
    return { ok: false, issue: { severity: 'error', code: 'missing-table', ...named, message: `the beam data of ${machine.name} ${data.id} have no applicator "${applicatorId}"`,
      expected: data.applicators.map((a) => a.id).join(', '), found: applicatorId } };
  }
  const cutouts = beam.blocks.filter((b) => b.type === 'APERTURE');
  if (beam.blocks.length > cutouts.length || cutouts.length > 1) return notChecked('an electron beam with shielding blocks or more than one cutout: not supported');
  const sadMm = beam.sourceAxisDistanceMm ?? machine.sadCm * MM_PER_CM;
  if (cp0.ssdMm === undefined && !ctx.ct) return notChecked('the plan gives no SSD, so without the CT the depth cannot be found');
  const frame = beamFrame(cp0, ctx.patientPosition as never, sadMm)!;

  // The cutout outline is given at the isocenter plane; Se and PDD are tabulated at the nominal SSD.
  const toNominal = (data.calibration.ssd0Cm * MM_PER_CM) / sadMm;
  const outline: Polygon | undefined = cutouts[0]?.outlineMm.map(([x, y]) => [x * toNominal, y * toNominal] as const);
  let field: ElectronPointInput['field'];
  let cutoutText: string;
  const rectangle = outline ? axisAlignedRectangle(outline) : undefined;
  if (!outline) {
    field = { kind: 'equivalent-square', sideCm: applicator.sideCm, method: 'the open applicator' };
    cutoutText = `no cutout: the open applicator ${applicator.id} (${applicator.sideCm} cm)`;
  } else if (rectangle) {
    field = { kind: 'rectangle', xCm: rectangle.x / MM_PER_CM, yCm: rectangle.y / MM_PER_CM };
    cutoutText = `rectangular cutout ${(rectangle.x / MM_PER_CM).toFixed(1)} × ${(rectangle.y / MM_PER_CM).toFixed(1)} cm: Se and PDD by the square-root rule`;
  } else {
    const side = Math.sqrt(polygonArea(outline)) / MM_PER_CM;
    field = { kind: 'equivalent-square', sideCm: side, method: 'equal area' };
    cutoutText = `cutout of ${outline.length} vertices as the square of equal area (${side.toFixed(2)} cm)`;
  }
  if (outline) {
    const xs = outline.map((p) => p[0]);
    const ys = outline.map((p) => p[1]);
    const span = Math.max(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys)) / MM_PER_CM;
    if (span > applicator.sideCm + 0.5) return notChecked(`the cutout (${span.toFixed(1)} cm across) is larger than the applicator ${applicator.id} (${applicator.sideCm} cm)`);
  }

  const at = flatDepth(frame, point.patientMm, cp0.ssdMm ?? 0);
  let depthCm = at.depthMm / MM_PER_CM;
  let ssdCm = (cp0.ssdMm ?? 0) / MM_PER_CM;
  let ctResult: NonNullable<BeamCheck['calculation']>['ct'];
  let lookupDepthCm = depthCm;
  if (ctx.ct) {
    const t = ctDepth(ctx.ct.volume, frame.sourcePatientMm, point.patientMm, ctDepthOptions(ctx.ct));
    if (!t.ok) return notChecked(`CT: ${t.message}`);
    const axis = ctAxisSsdMm(ctx.ct, frame, sadMm);
    depthCm = t.value.geometricDepthMm / MM_PER_CM;
    ssdCm = t.value.ssdMm / MM_PER_CM;
    lookupDepthCm = t.value.radiologicalDepthMm / MM_PER_CM;
    ctResult = {
      ...(axis !== undefined ? { ssdAlongAxisMm: axis } : {}),
      ...(axis !== undefined && cp0.ssdMm !== undefined ? { ssdDifferenceMm: axis - cp0.ssdMm } : {}),
      ...(cp0.ssdMm !== undefined ? { planSsdMm: cp0.ssdMm } : {}), ssdAlongRayMm: t.value.ssdMm, geometricDepthMm: t.value.geometricDepthMm, radiologicalDepthMm: t.value.radiologicalDepthMm,
      entryPatientMm: [...t.value.entryPatientMm] as [number, number, number], densityRange: [...t.value.densityRange] as [number, number],
      ...(t.value.nearestInterfaceMm !== undefined ? { nearestInterfaceMm: t.value.nearestInterfaceMm } : {}),
      correctionFactor: 1, homogeneousDoseCGy: 0, bodyThresholdHu: ctx.ct.bodyThresholdHu, body: ctx.ct.bodySource,
      method: 'the PDD at the radiological depth (equivalent thickness by relative electron density)',
    };
  }
  if (depthCm < 0) return notChecked(`the calculation point lies ${(-depthCm).toFixed(1)} cm above the surface`);
  const r = electronDosePerMu(data, { applicatorId, field, depthCm: lookupDepthCm, ssdCm });
  if (!r.ok) return notChecked(r.issues.map((i) => i.message).join('; '));
  const mu = entry.beamMeterset!;
  if (ctResult) {
    const homogeneous = electronDosePerMu(data, { applicatorId, field, depthCm, ssdCm });
    if (!homogeneous.ok) return notChecked(`the homogeneous comparison: ${homogeneous.issues.map((i) => i.message).join('; ')}`);
    ctResult = { ...ctResult, correctionFactor: r.value.dosePerMuCGy / homogeneous.value.dosePerMuCGy, homogeneousDoseCGy: mu * homogeneous.value.dosePerMuCGy };
  }
  const dosePerMuCGy = r.value.dosePerMuCGy;
  const compared = comparison(mu, dosePerMuCGy, base.planningSystemDoseCGy);

  const offAxisCm = at.offAxisMm / MM_PER_CM;
  const approximations = [`${cutoutText}; effective SSD ${r.value.effectiveSsdCm.toFixed(1)} cm`];
  if (Math.abs(r.value.airGapCm) > 1e-6) approximations.push(`extended SSD: the PDD measured at ${data.pdd.ssdCm} cm is used at ${ssdCm.toFixed(1)} cm, with the inverse square of the effective SSD for the air gap`);
  if (offAxisCm > 0.5) approximations.push(`the point is ${offAxisCm.toFixed(1)} cm from the central axis: electron doses are central-axis values (no off-axis ratio)`);
  if (beam.bolusRoiNumbers.length) approximations.push("a bolus is referenced: the depth is taken from the plan's SSD, which must include it");

  // Is the point fit for a point check? Edge of the cutout at the point's depth, build-up, the fall-off.
  const flags: string[] = [];
  const scale = at.sourceToPointAxialMm / (data.calibration.ssd0Cm * MM_PER_CM);
  const [px, py] = [at.atIsocenterPlaneMm[0] * toNominal, at.atIsocenterPlaneMm[1] * toNominal];
  const half = (applicator.sideCm * MM_PER_CM) / 2;
  const square: Polygon = [[-half, -half], [half, -half], [half, half], [-half, half]];
  const edge = outline ?? square;
  const edgeDistanceCm = ((insidePolygon(edge, px, py) ? 1 : -1) * polygonEdgeDistance(edge, px, py) * scale) / MM_PER_CM;
  if (edgeDistanceCm < policy.point.edgeMarginCm) {
    flags.push(edgeDistanceCm < 0 ? `the point lies outside the field (${(-edgeDistanceCm).toFixed(1)} cm beyond its edge)` : `the point is ${edgeDistanceCm.toFixed(1)} cm from the field edge (margin ${policy.point.edgeMarginCm} cm)`);
  }
  const pddPercent = 100 * r.value.factors.find((f) => f.key === 'PDD')!.value;
  const dmaxCm = electronDmaxCm(data, field) ?? 0;
  if (lookupDepthCm < dmaxCm - 0.05) flags.push(`the point is in the build-up region (${lookupDepthCm.toFixed(1)} cm, shallower than this field's dmax ${dmaxCm.toFixed(1)} cm)`);
  else if (pddPercent < FALL_OFF_PERCENT) flags.push(`the point lies on the steep fall-off of the depth dose (PDD ${pddPercent.toFixed(0)} % < ${FALL_OFF_PERCENT} %)`);

  const heterogeneous = isHeterogeneous(policy, ctResult?.densityRange);
  const openArea = outline ? polygonArea(outline) : (2 * half) ** 2;
  const category = categorize(policy, { wedged: false, offAxisCm, irradiatedSquareCm: r.value.fieldSideCm, openFraction: openArea / (2 * half) ** 2, ssdCm, shaped: !!outline && !rectangle, heterogeneous });
  const planningSystemDepths = besideOurs(ctx.planningSystemDepths, depthCm * MM_PER_CM, ctResult ? lookupDepthCm * MM_PER_CM : undefined, ssdCm * MM_PER_CM);
  return {
    ok: true,
    value: {
      ...base,
      status: 'checked',
      calculation: {
        machineBeam: `${machine.name} ${data.id}`,
        setup: 'SSD',
        setupReason: `an electron beam with applicator ${applicator.id} at SSD ${ssdCm.toFixed(1)} cm (nominal ${data.calibration.ssd0Cm} cm)`,
        ssdCm, depthCm, offAxisCm,
        collimatorFieldCm: { x: applicator.sideCm, y: applicator.sideCm }, collimatorSquareCm: applicator.sideCm, irradiatedSquareCm: r.value.fieldSideCm,
        approximations,
        factors: factorRows(r.value.factors),
        dosePerMuCGy,
        ...compared,
        clamps: clampTexts(r.value.clamps),
        ...(ctResult ? { ct: ctResult } : {}),
        ...(planningSystemDepths ? { planningSystemDepths } : {}),
        electron: { applicatorId: applicator.id, cutout: outline ? (rectangle ? 'rectangle' : 'shaped') : 'none', fieldSideCm: r.value.fieldSideCm, effectiveSsdCm: r.value.effectiveSsdCm, airGapCm: r.value.airGapCm, pddPercent },
      },
      ...levelsOf(policy, category),
      fitness: { edgeDistanceCm, flags },
    },
  };
}
