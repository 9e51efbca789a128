import type { HeterogeneityMethod } from '../../physics/index.js';
import {
  type Beam,
  type CalculatedBeam,
  type CalculationPoint,
  cGyFromGy,
  type Issue,
  type MachineModel,
  note,
  type NotCheckedBeam,
  type NoteCode,
  type NoteValue,
  type PatientPosition,
  type PlanningSystemDepths,
  type ReferencedBeam,
  type Result,
} from '../../model/index.js';
import type { PatientCt } from '../patient-ct.js';
import type { Policy } from '../policy.js';

/** Everything one beam's check needs: the beam, its fraction-group entry, its point, the machine and the options. */
export interface BeamCheckContext {
  readonly beam: Beam;
  readonly entry: ReferencedBeam;
  readonly point: CalculationPoint;
  readonly patientPosition: PatientPosition;
  readonly machine: MachineModel;
  readonly policy: Policy;
  readonly suggestPoint: boolean;
  /** The patient's CT, when given: depths and SSD traced through it, heterogeneity corrected. */
  readonly ct?: PatientCt | undefined;
  /** How photon doses are corrected for heterogeneity with the CT (default: the TPR ratio). */
  readonly heterogeneity?: HeterogeneityMethod | undefined;
  /** Whether the planning system's dose is heterogeneity corrected, as its RT Dose states (undefined: not known). */
  readonly planningSystemCorrected?: boolean | undefined;
  /** The planning system's own depths at this point, when the plan carries them (see planning-system-depths.ts). */
  readonly planningSystemDepths?: PlanningSystemDepths | undefined;
}

/**
 * One beam's result before its verdict, or an input issue (beam data lacking the beam's energy,
 * wedge, tray or applicator) that refuses the plan.
 */
export type BeamOutcome = Result<CalculatedBeam | NotCheckedBeam>;

/** A step that ends the beam's check early carries the outcome; any other return value lets the check go on. */
export interface Stopped {
  readonly stopped: BeamOutcome;
}
export const isStopped = (x: object): x is Stopped => 'stopped' in x;

/** What the plan says of a beam, before any calculation. */
export function beamIdentity(beam: Beam, entry: ReferencedBeam): Omit<NotCheckedBeam, 'status' | 'reason' | 'point'> {
  const energy = beam.controlPoints[0]?.nominalEnergyMeV;
  return {
    beamNumber: beam.number,
    ...(beam.name ? { beamName: beam.name } : {}),
    radiationType: beam.radiationType,
    ...(energy !== undefined ? { nominalEnergy: energy } : {}),
    ...(entry.beamMeterset !== undefined ? { plannedMu: entry.beamMeterset } : {}),
    ...(entry.beamDoseGy !== undefined ? { planningSystemDoseCGy: cGyFromGy(entry.beamDoseGy) } : {}),
  };
}

/** A beam not checked, with the reason as a coded note (and its point, when one was chosen). */
export function notCheckedBeam(
  beam: Beam,
  entry: ReferencedBeam,
  reason: NoteCode,
  values: Readonly<Record<string, NoteValue | undefined>> = {},
  point?: CalculationPoint,
): NotCheckedBeam {
  return { ...beamIdentity(beam, entry), status: 'not checked', reason: note(reason, values), ...(point ? { point } : {}) };
}

/** Ends a beam's check: not checked, for the reason given. */
export function stopNotChecked(ctx: BeamCheckContext, reason: NoteCode, values: Readonly<Record<string, NoteValue | undefined>> = {}): Stopped {
  return { stopped: { ok: true, value: notCheckedBeam(ctx.beam, ctx.entry, reason, values, ctx.point) } };
}

/** Ends a beam's check with an input issue that refuses the plan; the issue names the beam. */
export function stopRefused(ctx: BeamCheckContext, issues: readonly Issue[]): Stopped {
  return {
    stopped: { ok: false, issues: issues.map((i) => ({ ...i, beamNumber: ctx.beam.number, ...(ctx.beam.name ? { beamName: ctx.beam.name } : {}) })) },
  };
}
