import type { HeterogeneityMethod } from '../physics/index.js';
import {
  type BeamCheck,
  type CalculatedBeam,
  type DoseGrid,
  type FractionGroup,
  type FractionGroupCheck,
  type Issue,
  type MachineModel,
  note,
  type Note,
  type NotCheckedBeam,
  type Plan,
  type PlanCheck,
  type ReferencedBeam,
  type PlanVerdict,
} from '../model/index.js';
import { isSupportedPosition, unsupportedReason } from './beam-support.js';
import { checkBeam, notCheckedBeam } from './beam/index.js';
import { choosePoint } from './choose-point.js';
import { atUserPoint } from './dose-at-user-point.js';
import { attachDoseGrids, withGrid } from './dose-grids.js';
import { explainPlan } from './explain-totals.js';
import { judge } from './judge.js';
import { machineLimitIssues } from './machine-limits.js';
import { matchMachine } from './match-machine.js';
import type { PatientCt } from './patient-ct.js';
import { planningSystemDepths, planStatesCorrection } from './planning-system-depths.js';
import type { Policy } from './policy.js';
import { courseTotals, groupTotals } from './totals.js';
import { worst } from './verdict.js';

export interface CheckOptions {
  readonly machine: MachineModel;
  readonly policy: Policy;
  /** Plan machine name → beam-data machine name (`--machine-alias`). */
  readonly aliases: ReadonlyMap<string, string>;
  readonly pointPatientMm?: [number, number, number];
  readonly suggestPoint: boolean;
  /** Explain every beam's deviation (by default only beams not within tolerance). */
  readonly explainAll?: boolean;
  /** Whether to explain deviations at all (default yes; the bench times the check without). */
  readonly explain?: boolean;
  readonly ct?: PatientCt;
  /** The planning system's RT Dose grids for this plan (any summation type). */
  readonly doseGrids?: readonly DoseGrid[];
  /** How photon doses are corrected for heterogeneity with the CT (default: the TPR ratio). */
  readonly heterogeneity?: HeterogeneityMethod;
}

/** The plan's file as read: where, its hash, and what its import warned of (carried into the result). */
export interface PlanFile {
  readonly path: string;
  readonly sha256: string;
  readonly importWarnings?: readonly Issue[];
}

/**
 * The worst beam verdict; "not verified" in place of any milder one when a beam that delivers dose
 * went unchecked or none was checked (a beam beyond its action level stays the headline).
 */
function planVerdict(beams: readonly BeamCheck[], fullyVerified: boolean): PlanVerdict {
  let verdict: PlanVerdict = 'within tolerance';
  for (const b of beams) if (b.status === 'checked') verdict = worst<PlanVerdict>(verdict, b.verdict);
  return fullyVerified ? verdict : worst<PlanVerdict>(verdict, 'not verified');
}

/**
 * The independent check of one plan: every beam of every fraction group gets a dose or a reason
 * why not, a deviation from the planning system and a verdict; then the totals per point, per
 * fraction and over the course. A deviation beyond a level is a result, never an exception.
 */
export function checkPlan(plan: Plan, file: PlanFile, o: CheckOptions): PlanCheck {
  const issues: Issue[] = [];
  const frameIssue = ctFrameIssue(plan, file, o);
  if (frameIssue) issues.push(frameIssue);
  const ct = issues.length ? undefined : o.ct;
  const doses = planningSystemDoses(plan, o);
  const beamContext = { ...o, ct, ctRefused: !!o.ct && !ct, planningSystemCorrected: doses.planningSystemCorrected };
  let machine: PlanCheck['machine'];
  const checkedGroups: FractionGroupCheck[] = plan.fractionGroups.map((g) => {
    const beams = g.beams.map((entry) => {
      const r = checkEntry(plan, g, entry, beamContext);
      for (const i of r.issues ?? []) issues.push({ ...i, file: file.path });
      machine ??= r.machine;
      return atUserPoint(r.beam, doses.grids);
    });
    const judged = judge(beams, o.policy);
    return {
      number: g.number,
      ...(g.fractionsPlanned !== undefined ? { fractionsPlanned: g.fractionsPlanned } : {}),
      beams: judged,
      totals: groupTotals(plan, g, judged),
    };
  });
  const explained = explainGroups(plan, checkedGroups, { ...beamContext, suggestPoint: false }, doses, machine);
  const groups = attachDoseGrids(explained.groups, doses.grids);
  const all = groups.flatMap((g) => g.beams);
  // A setup beam delivers no dose: it needs no check and leaves the plan verified.
  const notChecked = all.filter((b) => b.status !== 'checked' && b.reason.code !== 'setup-beam').length;
  const checked = all.filter((b) => b.status === 'checked').length;
  const fullyVerified = notChecked === 0 && issues.length === 0 && checked > 0;
  return {
    file: file.path,
    fileSha256: file.sha256,
    planLabel: plan.label,
    ...(plan.name ? { planName: plan.name } : {}),
    ...(plan.patient.id ? { patientId: plan.patient.id } : {}),
    ...(plan.patient.name ? { patientName: plan.patient.name } : {}),
    sopInstanceUid: plan.sopInstanceUid,
    ...(plan.approvalStatus ? { approvalStatus: plan.approvalStatus } : {}),
    ...(machine ? { machine } : {}),
    fractionGroups: groups,
    courseTotals: explained.courseTotals.map((t) =>
      withGrid(
        t,
        doses.grids.find((g) => g.summationType === 'PLAN'),
      ),
    ),
    verdict: planVerdict(all, fullyVerified),
    fullyVerified,
    issues,
    importWarnings: [...(file.importWarnings ?? [])],
    warnings: planWarnings(plan, o, { ct, doses, notChecked, checked }),
  };
}

/** The options of one beam's check: the plan's CT when it is the plan's, and what the planning system says of heterogeneity. */
type EntryOptions = Omit<CheckOptions, 'ct'> & { ct: PatientCt | undefined; ctRefused: boolean; planningSystemCorrected: boolean | undefined };

/** A CT of another frame of reference cannot be the plan's: an input error, and the plan is checked without it. */
function ctFrameIssue(plan: Plan, file: PlanFile, o: CheckOptions): Issue | undefined {
  const ctFrame = o.ct?.volume.frameOfReferenceUid;
  if (!o.ct || ctFrame === plan.frameOfReferenceUid) return undefined;
  return {
    severity: 'error',
    code: 'inconsistent',
    file: file.path,
    path: 'FrameOfReferenceUID',
    message: "the CT and the plan are in different frames of reference: the CT cannot be this plan's",
    expected: `the plan's ${plan.frameOfReferenceUid ?? '(none)'}`,
    found: `the CT's ${ctFrame}`,
  };
}

/** The planning system's dose grids of this plan, and whether it corrected for heterogeneity (as the grids and the plan say). */
interface PlanningSystemDoses {
  readonly grids: readonly DoseGrid[];
  /** How the correction is stated (the grids' terms, the plan's Equivalent Depth). */
  readonly corrections: readonly string[];
  readonly planningSystemCorrected: boolean | undefined;
}

function planningSystemDoses(plan: Plan, o: CheckOptions): PlanningSystemDoses {
  const grids = (o.doseGrids ?? []).filter(
    (g) => g.referencedPlanUid === plan.sopInstanceUid || (!g.referencedPlanUid && g.frameOfReferenceUid === plan.frameOfReferenceUid),
  );
  const corrections = [...new Set(grids.flatMap((g) => g.tissueHeterogeneityCorrection ?? []))];
  const gridSays = corrections.length ? corrections.some((c) => c === 'IMAGE' || c === 'ROI_OVERRIDE') : undefined;
  const planSays = planStatesCorrection(plan);
  const planningSystemCorrected = gridSays === true || planSays === true ? true : (gridSays ?? planSays);
  if (planSays) corrections.push('Equivalent Depth in the plan');
  return { grids, corrections, planningSystemCorrected };
}

/** The groups with their explanations (unless turned off), each cause able to recheck a beam with edited beam data. */
function explainGroups(
  plan: Plan,
  checkedGroups: FractionGroupCheck[],
  beamContext: EntryOptions,
  doses: PlanningSystemDoses,
  machine: PlanCheck['machine'],
): { groups: FractionGroupCheck[]; courseTotals: PlanCheck['courseTotals'] } {
  if ((beamContext.explain ?? true) === false) return { groups: checkedGroups, courseTotals: courseTotals(checkedGroups) };
  return explainPlan(
    checkedGroups,
    {
      machine: beamContext.machine,
      all: beamContext.explainAll ?? false,
      grids: doses.grids,
      largeSsdCm: beamContext.policy.classification.largeSsdCm,
      machineMatch: machine,
      planningSystemCorrected: doses.planningSystemCorrected,
    },
    (number) => {
      const g = plan.fractionGroups.find((x) => x.number === number)!;
      return (beamNumber, edited) => {
        const entry = g.beams.find((e) => e.beamNumber === beamNumber);
        const r = entry ? checkEntry(plan, g, entry, { ...beamContext, machine: edited }).beam : undefined;
        return r?.status === 'checked' ? r.calculation.independentDoseCGy : undefined;
      };
    },
  );
}

/** What the plan's result must say beside its beams: beams not checked, approval, the RT Doses unused, heterogeneity. */
function planWarnings(
  plan: Plan,
  o: CheckOptions,
  s: { ct: CheckOptions['ct']; doses: PlanningSystemDoses; notChecked: number; checked: number },
): Note[] {
  const { ct, doses, notChecked, checked } = s;
  const warnings: Note[] = [];
  if (notChecked) warnings.push(note('beams-not-checked', { count: notChecked }));
  if (checked === 0) warnings.push(note('no-beam-checked'));
  if (o.doseGrids?.length && !doses.grids.length) warnings.push(note('dose-not-this-plan', { files: o.doseGrids.map((g) => g.file).join(', ') }));
  if (plan.approvalStatus !== 'APPROVED') warnings.push(note('approval-status', { status: plan.approvalStatus }));
  if (!ct && checked > 0 && doses.planningSystemCorrected)
    warnings.push(note('planning-system-heterogeneity-corrected', { correction: doses.corrections.join(', ') }));
  if (!ct && checked > 0 && doses.planningSystemCorrected === undefined) warnings.push(note('heterogeneity-unknown'));
  return warnings;
}

/**
 * One beam of a fraction group: what the engine supports, the machine, the point; then the beam's
 * own check. An input issue (no beam data for the machine, a table missing) refuses the plan.
 */
function checkEntry(
  plan: Plan,
  g: FractionGroup,
  entry: ReferencedBeam,
  o: EntryOptions,
): { beam: CalculatedBeam | NotCheckedBeam; issues?: readonly Issue[]; machine?: PlanCheck['machine'] } {
  const beam = plan.beams.find((b) => b.number === entry.beamNumber)!;
  const position = plan.patientSetups.find((s) => s.number === beam.patientSetupNumber)?.position ?? plan.patientSetups[0]?.position;
  const why = unsupportedReason(beam, position, entry.beamMeterset);
  if (why) return { beam: notCheckedBeam(beam, entry, why.code, why.values) };
  const m = matchMachine(beam.machineName, o.machine, o.aliases);
  if (!m.ok) {
    const issues = m.issues.map((i) => ({ ...i, beamNumber: beam.number, ...(beam.name ? { beamName: beam.name } : {}) }));
    return { beam: notCheckedBeam(beam, entry, 'input-refused', { message: m.issues.map((i) => i.message).join('; ') }), issues };
  }
  const machine = { planName: beam.machineName!, dataName: o.machine.name, via: m.value };
  const beyond = machineLimitIssues(beam, entry, o.machine);
  if (beyond.length)
    return { beam: notCheckedBeam(beam, entry, 'input-refused', { message: beyond.map((i) => i.message).join('; ') }), issues: beyond, machine };
  const point = choosePoint(plan, g, entry, beam, o.pointPatientMm);
  if (!point) return { beam: notCheckedBeam(beam, entry, 'no-point'), machine };
  if (o.ctRefused) return { beam: notCheckedBeam(beam, entry, 'ct-not-this-plan'), machine };
  if (!isSupportedPosition(position)) return { beam: notCheckedBeam(beam, entry, 'no-patient-position'), machine };
  const r = checkBeam({
    beam,
    entry,
    point,
    patientPosition: position,
    machine: o.machine,
    policy: o.policy,
    suggestPoint: o.suggestPoint,
    ct: o.ct,
    heterogeneity: o.heterogeneity,
    planningSystemCorrected: o.planningSystemCorrected,
    planningSystemDepths: planningSystemDepths(plan, g, entry, beam, point),
  });
  if (!r.ok)
    return { beam: notCheckedBeam(beam, entry, 'input-refused', { message: r.issues.map((i) => i.message).join('; ') }), issues: r.issues, machine };
  return { beam: r.value, machine };
}
