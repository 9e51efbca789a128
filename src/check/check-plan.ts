import { doseAtPointGy } from '../geometry/index.js';
import type { HeterogeneityMethod } from '../physics/index.js';
import { type BeamCheck, cGyFromGy, MM_PER_CM, type DoseGrid, type FractionGroup, type FractionGroupCheck, type Issue, type MachineModel, type Plan, type PlanCheck, type Verdict } from '../model/index.js';
import { isModulated, unsupportedReason } from './beam-support.js';
import { checkElectronBeam } from './check-electron.js';
import { checkModulatedBeam } from './check-modulated.js';
import { beamStub, checkBeam } from './check-beam.js';
import { choosePoint } from './choose-point.js';
import { planningSystemDepths } from './planning-system-depths.js';
import { matchMachine } from './match-machine.js';
import type { PatientCt } from './patient-ct.js';
import type { Policy } from './policy.js';
import { verdictFor, worst } from './verdict.js';

export interface CheckOptions {
  readonly machine: MachineModel;
  readonly policy: Policy;
  /** Plan machine name → beam-data machine name (`--machine-alias`). */
  readonly aliases: ReadonlyMap<string, string>;
  readonly pointPatientMm?: [number, number, number];
  readonly suggestPoint: boolean;
  readonly ct?: PatientCt;
  /** The planning system's RT Dose grids for this plan (any summation type). */
  readonly doseGrids?: readonly DoseGrid[];
  /** How photon doses are corrected for heterogeneity with the CT (default: the TPR ratio). */
  readonly heterogeneity?: HeterogeneityMethod;
}

type Total = PlanCheck['courseTotals'][number];
const key = (p: readonly number[]) => p.map((v) => v.toFixed(1)).join(',');

/**
 * The independent check of one plan: every beam of every fraction group gets a dose or a reason
 * why not, a deviation from the planning system and a verdict; then the totals per point, per
 * fraction and over the course. A deviation beyond a level is a result, never an exception.
 */
export function checkPlan(plan: Plan, file: { path: string; sha256: string }, o: CheckOptions): PlanCheck {
  const issues: Issue[] = [];
  const warnings: string[] = [];
  let machineMatch: PlanCheck['machine'];
  const ctFrame = o.ct?.volume.frameOfReferenceUid;
  if (o.ct && ctFrame !== plan.frameOfReferenceUid) {
    issues.push({ severity: 'error', code: 'inconsistent', file: file.path, path: 'FrameOfReferenceUID',
      message: 'the CT and the plan are in different frames of reference: the CT cannot be this plan\'s', expected: `the plan's ${plan.frameOfReferenceUid ?? '(none)'}`, found: `the CT's ${ctFrame}` });
  }
  const ct = issues.length ? undefined : o.ct;
  const grids = (o.doseGrids ?? []).filter((g) => g.referencedPlanUid === plan.sopInstanceUid || (!g.referencedPlanUid && g.frameOfReferenceUid === plan.frameOfReferenceUid));
  const checkedGroups: FractionGroupCheck[] = plan.fractionGroups.map((g) => {
    const beams = g.beams.map((entry): BeamCheck => {
      const beam = plan.beams.find((b) => b.number === entry.beamNumber)!;
      const stub = beamStub(beam, entry);
      const position = plan.patientSetups.find((s) => s.number === beam.patientSetupNumber)?.position ?? plan.patientSetups[0]?.position;
      const why = unsupportedReason(beam, position, entry.beamMeterset);
      if (why) return { ...stub, reason: why };
      const m = matchMachine(beam.machineName, o.machine, o.aliases);
      if (!m.ok) {
        issues.push({ ...m.issue, beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}), file: file.path });
        return { ...stub, reason: m.issue.message };
      }
      machineMatch ??= { planName: beam.machineName!, dataName: o.machine.name, via: m.via };
      const point = choosePoint(plan, g, entry, beam, o.pointPatientMm);
      if (!point) return { ...stub, reason: 'no calculation point: the plan names none and the beam has no isocenter' };
      if (o.ct && !ct) return { ...stub, reason: 'the CT does not belong to this plan' };
      const r = (beam.radiationType === 'ELECTRON' ? checkElectronBeam : isModulated(beam) ? checkModulatedBeam : checkBeam)({ beam, entry, point, patientPosition: position!, machine: o.machine, policy: o.policy, suggestPoint: o.suggestPoint, ...(ct ? { ct } : {}), ...(o.heterogeneity ? { heterogeneity: o.heterogeneity } : {}), planningSystemDepths: planningSystemDepths(plan, g, entry, beam, point) });
      if (!r.ok) {
        issues.push({ ...r.issue, file: file.path });
        return { ...stub, reason: r.issue.message };
      }
      return r.value;
    });
    const judged = judge(beams, o.policy);
    return { number: g.number, ...(g.fractionsPlanned !== undefined ? { fractionsPlanned: g.fractionsPlanned } : {}), beams: judged, totals: totals(plan, g, judged) };
  });

  const groups = attachDoseGrids(checkedGroups, grids);
  const checked = groups.flatMap((g) => g.beams).filter((b) => b.status === 'checked');
  const notChecked = groups.flatMap((g) => g.beams).filter((b) => b.status !== 'checked');
  let verdict: Verdict = 'within tolerance';
  for (const b of checked) verdict = worst(verdict, b.verdict!);
  if (notChecked.length) {
    verdict = worst(verdict, 'needs review');
    warnings.push(`${notChecked.length} beam(s) not checked: the plan is not fully verified`);
  }
  if (checked.length === 0) warnings.push('no beam of this plan could be checked');
  if (plan.approvalStatus !== 'APPROVED') warnings.push(`the plan's approval status is ${plan.approvalStatus ?? 'not given'}`);
  return {
    file: file.path,
    fileSha256: file.sha256,
    planLabel: plan.label,
    ...(plan.name ? { planName: plan.name } : {}),
    ...(plan.patient.id ? { patientId: plan.patient.id } : {}),
    sopInstanceUid: plan.sopInstanceUid,
    ...(plan.approvalStatus ? { approvalStatus: plan.approvalStatus } : {}),
    ...(machineMatch ? { machine: machineMatch } : {}),
    fractionGroups: groups,
    courseTotals: courseTotals(groups).map((t) => withGrid(t, grids.find((g) => g.summationType === 'PLAN'))),
    verdict,
    fullyVerified: notChecked.length === 0 && issues.length === 0 && checked.length > 0,
    issues,
    warnings,
  };
}

/** Verdicts per beam: a beam giving little to its point is judged on its share of the point's dose. */
function judge(beams: BeamCheck[], policy: Policy): BeamCheck[] {
  // The point's dose is the planning system's doses of the beams checked there (a beam not checked
  // has no point of ours); a smaller total only makes the share larger, so the judging stricter.
  const byPoint = new Map<string, number>();
  for (const b of beams) if (b.status === 'checked' && b.point && b.planningSystemDoseCGy !== undefined) {
    byPoint.set(key(b.point.patientMm), (byPoint.get(key(b.point.patientMm)) ?? 0) + b.planningSystemDoseCGy);
  }
  return beams.map((b) => {
    if (b.status !== 'checked' || !b.calculation || !b.point) return b;
    const reasons: string[] = [];
    let verdict: Verdict;
    let judgedDeviationPercent: number | undefined;
    let judgedOn: BeamCheck['judgedOn'];
    const tps = b.planningSystemDoseCGy;
    const total = byPoint.get(key(b.point.patientMm)) ?? 0;
    if (tps === undefined || !(tps > 0) || b.calculation.doseDeviationPercent === undefined) {
      verdict = 'needs review';
      reasons.push('the plan gives no Beam Dose for this beam, so there is nothing to compare with');
    } else if (total > 0 && tps / total < policy.lowContributionShare) {
      judgedDeviationPercent = (100 * (b.calculation.independentDoseCGy - tps)) / total;
      judgedOn = 'share of the point dose';
      verdict = verdictFor(judgedDeviationPercent, b.tolerancePercent!, b.actionPercent!);
      reasons.push(`the beam gives ${((100 * tps) / total).toFixed(1)} % of the point's dose, so it is judged on its share of the point dose`);
    } else {
      judgedDeviationPercent = b.calculation.doseDeviationPercent;
      judgedOn = 'beam dose';
      verdict = verdictFor(judgedDeviationPercent, b.tolerancePercent!, b.actionPercent!);
    }
    if (!b.point.planningSystemDoseHere) {
      verdict = worst(verdict, 'needs review');
      reasons.push(b.point.source === 'user' ? "the planning system's Beam Dose refers to another point than --point" : 'the plan does not say where its Beam Dose applies');
    }
    if (b.fitness?.flags.length) {
      verdict = worst(verdict, 'needs review');
      reasons.push(`the point is not fit for a point check: ${b.fitness.flags.join('; ')}`);
    }
    const ct = b.calculation.ct;
    if (ct) {
      reasons.push(`CT depths: heterogeneity corrected by ${ct.method ?? 'the TPR ratio'}, CF = ${ct.correctionFactor.toFixed(4)} (homogeneous dose ${ct.homogeneousDoseCGy.toFixed(1)} cGy)`);
      if (ct.ssdDifferenceMm !== undefined && Math.abs(ct.ssdDifferenceMm) > policy.ct.ssdToleranceMm) {
        verdict = worst(verdict, 'needs review');
        reasons.push(`the SSD from the CT (${(ct.ssdAlongAxisMm! / MM_PER_CM).toFixed(1)} cm) differs from the plan's (${(ct.planSsdMm! / MM_PER_CM).toFixed(1)} cm) by ${ct.ssdDifferenceMm.toFixed(1)} mm (tolerance ${policy.ct.ssdToleranceMm} mm): bolus missing, wrong CT or wrong isocenter?`);
      }
    }
    const theirs = b.calculation.planningSystemDepths;
    if (theirs) {
      reasons.push(`the planning system's own depth data: ${[theirs.depthMm !== undefined ? `depth ${theirs.depthMm.toFixed(1)} mm (ours ${signedMm(theirs.depthDifferenceMm)})` : '',
        theirs.equivalentDepthMm !== undefined ? `equivalent depth ${theirs.equivalentDepthMm.toFixed(1)} mm${theirs.equivalentDepthDifferenceMm !== undefined ? ` (ours ${signedMm(theirs.equivalentDepthDifferenceMm)})` : ''}` : '',
        theirs.ssdMm !== undefined ? `SSD ${theirs.ssdMm.toFixed(1)} mm (ours ${signedMm(theirs.ssdDifferenceMm)})` : ''].filter(Boolean).join(', ')}`);
    }
    if (b.calculation.approximations.length) reasons.push(...b.calculation.approximations);
    return { ...b, verdict, verdictReasons: reasons, ...(judgedDeviationPercent !== undefined ? { judgedDeviationPercent } : {}), ...(judgedOn ? { judgedOn } : {}) };
  });
}

const signedMm = (v: number | undefined) => (v === undefined ? '—' : `${v >= 0 ? '+' : ''}${v.toFixed(1)} mm`);

/** Per point of one fraction group: the sum of the checked beams, against the planning system and the prescription. */
function totals(plan: Plan, g: FractionGroup, beams: readonly BeamCheck[]): Total[] {
  const points = new Map<string, BeamCheck[]>();
  for (const b of beams) if (b.point) points.set(key(b.point.patientMm), [...(points.get(key(b.point.patientMm)) ?? []), b]);
  const out: Total[] = [];
  for (const at of points.values()) {
    const checked = at.filter((b) => b.status === 'checked' && b.planningSystemDoseCGy !== undefined);
    if (!checked.length) continue;
    const ind = checked.reduce((s, b) => s + b.calculation!.independentDoseCGy, 0);
    const tps = checked.reduce((s, b) => s + b.planningSystemDoseCGy!, 0);
    const point = at[0]!.point!.patientMm;
    const rx = prescriptionPerFractionCGy(plan, g, point);
    out.push({
      pointPatientMm: point, beams: checked.map((b) => b.beamNumber), independentDoseCGy: ind, planningSystemDoseCGy: tps,
      deviationPercent: (100 * (ind - tps)) / tps,
      ...(rx !== undefined ? { prescriptionPerFractionCGy: rx, independentVsPrescriptionPercent: (100 * (ind - rx)) / rx, planningSystemVsPrescriptionPercent: (100 * (tps - rx)) / rx } : {}),
      // Beams not checked have no point of ours: any of them makes the group's totals incomplete.
      complete: checked.length === at.length && beams.every((b) => b.status === 'checked'),
    });
  }
  return out;
}

/** The fraction group's prescription at a point, per fraction, when its dose reference lies there. */
function prescriptionPerFractionCGy(plan: Plan, g: FractionGroup, point: readonly number[]): number | undefined {
  if (!g.fractionsPlanned) return undefined;
  for (const r of g.doseReferences) {
    const d = plan.doseReferences.find((x) => x.number === r.doseReferenceNumber);
    const gy = r.targetPrescriptionDoseGy ?? d?.targetPrescriptionDoseGy;
    if (d?.pointPatientMm && gy !== undefined && key(d.pointPatientMm) === key(point)) return cGyFromGy(gy) / g.fractionsPlanned;
  }
  if (plan.fractionGroups.length === 1) {
    const d = plan.doseReferences.find((x) => x.pointPatientMm && x.targetPrescriptionDoseGy !== undefined && key(x.pointPatientMm) === key(point));
    if (d) return cGyFromGy(d.targetPrescriptionDoseGy!) / g.fractionsPlanned;
  }
  return undefined;
}

/** Over the course: Σ over fraction groups of fractions × the group's total, per point. */
function courseTotals(groups: readonly FractionGroupCheck[]): Total[] {
  const byPoint = new Map<string, Total>();
  for (const g of groups) {
    const n = g.fractionsPlanned ?? 0;
    for (const t of g.totals) {
      const k = key(t.pointPatientMm);
      const prev = byPoint.get(k);
      const ind = (prev?.independentDoseCGy ?? 0) + n * t.independentDoseCGy;
      const tps = (prev?.planningSystemDoseCGy ?? 0) + n * t.planningSystemDoseCGy;
      byPoint.set(k, { pointPatientMm: t.pointPatientMm, beams: [...(prev?.beams ?? []), ...t.beams], independentDoseCGy: ind, planningSystemDoseCGy: tps,
        deviationPercent: (100 * (ind - tps)) / tps, complete: (prev?.complete ?? true) && t.complete });
    }
  }
  return [...byPoint.values()];
}

/** The grid's dose at a total's point, when the grid is of the matching summation. */
function withGrid<T extends { pointPatientMm: readonly number[] }>(t: T, grid: DoseGrid | undefined): T {
  const gy = grid ? doseAtPointGy(grid, t.pointPatientMm as [number, number, number]) : undefined;
  return gy === undefined ? t : { ...t, doseGridCGy: cGyFromGy(gy), doseGridSummation: grid!.summationType };
}

/** Per-beam grids (BEAM) to their beams, per-fraction grids (FRACTION) to the group totals. */
function attachDoseGrids(groups: readonly FractionGroupCheck[], grids: readonly DoseGrid[]): FractionGroupCheck[] {
  if (!grids.length) return [...groups];
  return groups.map((g) => ({
    ...g,
    beams: g.beams.map((b) => {
      const grid = grids.find((x) => x.summationType === 'BEAM' && x.referencedBeamNumber === b.beamNumber);
      const gy = grid && b.point ? doseAtPointGy(grid, b.point.patientMm) : undefined;
      return gy === undefined ? b : { ...b, doseGridCGy: cGyFromGy(gy) };
    }),
    totals: g.totals.map((t) => withGrid(t, grids.find((x) => x.summationType === 'FRACTION'))),
  }));
}
