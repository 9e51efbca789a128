import { createHash } from 'node:crypto';
import type { LoadedMachine } from '../beamdata/index.js';
import { checkPlan, chooseMachine, type PatientCt, type Policy } from '../check/index.js';
import { importPlanBytes, readRtDose } from '../dicom/index.js';
import { type DoseGrid, type Result, note, type Note, type PlanCheck } from '../model/index.js';
import { loadPatientCts } from './patient-cts.js';
import { withWarnings } from './with-warnings.js';

/** The objects that arrived with a plan in its frame of reference: CT slices, a structure set, RT Doses. */
export interface Companions {
  readonly ctFiles: readonly string[];
  readonly structuresFile?: string | undefined;
  readonly doseFiles: readonly string[];
}

/** The companions as the check uses them, and why any could not be used (the plan is then checked without). */
export interface LoadedCompanions {
  readonly ct?: PatientCt;
  readonly doseGrids: readonly DoseGrid[];
  readonly warnings: readonly Note[];
}

/** Reads a group's CT (with its body from the structure set) and RT Doses; what cannot be used becomes a warning, never a refusal. */
export function loadCompanions(
  c: Companions,
  ct: { density: string; bodyThresholdHu?: number | undefined } | undefined,
  policy: Policy,
): LoadedCompanions {
  const warnings: Note[] = [];
  let patientCt: PatientCt | undefined;
  if (c.ctFiles.length && !ct) warnings.push(note('ct-without-density'));
  else if (c.ctFiles.length && ct) {
    const loaded = loadPatientCts(c.ctFiles, ct.density, ct.bodyThresholdHu ?? policy.ct.bodyThresholdHu, c.structuresFile);
    if (loaded.ok) patientCt = loaded.value[0];
    else warnings.push(note('ct-unusable', { message: loaded.issues.map((i) => i.message).join('; ') }));
  }
  const doseGrids: DoseGrid[] = [];
  for (const d of c.doseFiles) {
    const g = readRtDose(d);
    if (g.ok) doseGrids.push(g.value);
    else warnings.push(note('dose-unreadable', { message: g.issues.map((i) => i.message).join('; ') }));
  }
  return { ...(patientCt ? { ct: patientCt } : {}), doseGrids, warnings };
}

/**
 * An arrived plan checked against the beam data its machine names, with the companions in its frame
 * of reference; the companions' warnings travel with the result.
 */
export function checkArrivedPlan(
  bytes: Uint8Array,
  file: string,
  sha256: string,
  machines: readonly [LoadedMachine, ...LoadedMachine[]],
  policy: Policy,
  companions: LoadedCompanions,
): Result<{ result: PlanCheck; machine: LoadedMachine }> {
  const imported = importPlanBytes(bytes, file);
  if (!imported.ok) return imported;
  const plan = imported.value.plan;
  const aliases = new Map<string, string>();
  const machine = chooseMachine(plan, machines, (m) => m.machine, aliases);
  const ct = companions.ct && companions.ct.volume.frameOfReferenceUid === plan.frameOfReferenceUid ? companions.ct : undefined;
  const result = checkPlan(
    plan,
    { path: `sha256:${sha256}`, sha256, importWarnings: imported.warnings ?? [] },
    {
      machine: machine.machine,
      policy,
      aliases,
      suggestPoint: false,
      ...(ct ? { ct } : {}),
      ...(companions.doseGrids.length ? { doseGrids: companions.doseGrids } : {}),
    },
  );
  return { ok: true, value: { result: withWarnings(result, companions.warnings), machine } };
}

/**
 * The plan's content, whatever its encoding: the SHA-256 of what the importer read from it. The same
 * plan sent again in another transfer syntax (other bytes, the same values) has the same content.
 */
export function planContentSha256(bytes: Uint8Array, file: string): string | undefined {
  const imported = importPlanBytes(bytes, file);
  return imported.ok ? createHash('sha256').update(JSON.stringify(imported.value.plan)).digest('hex') : undefined;
}
