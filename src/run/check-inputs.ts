import type { LoadedMachine } from '../beamdata/index.js';
import type { PatientCt, Policy } from '../check/index.js';
import type { HeterogeneityMethod } from '../physics/index.js';
import { readRtDose } from '../dicom/index.js';
import type { DoseGrid, Issue, Result } from '../model/index.js';
import { loadBeamData } from './beam-data.js';
import { loadPatientCts } from './patient-cts.js';
import { loadPolicy } from './policy-file.js';

/** What a `check` run was asked for, once its options are validated. */
export interface CheckRequest {
  readonly beamData: string;
  readonly policy?: string | undefined;
  readonly point?: [number, number, number] | undefined;
  /** `PLANNAME=DATANAME` pairs. */
  readonly machineAlias: readonly string[];
  readonly suggestPoint: boolean;
  /** Explain every beam's deviation, not only those outside tolerance. */
  readonly explain?: boolean;
  readonly ct?: readonly string[] | undefined;
  readonly dose?: readonly string[] | undefined;
  readonly structures?: string | undefined;
  readonly density?: string | undefined;
  readonly heterogeneity: HeterogeneityMethod;
  readonly bodyThreshold?: number | undefined;
  readonly threads?: number | undefined;
}

/** Everything a check run reads before its first plan: beam data, policy, CT series, RT Doses. */
export interface CheckInputs {
  readonly machine: LoadedMachine;
  /** Warnings of the beam data's loading. */
  readonly warnings: readonly Issue[];
  readonly policy: Policy;
  readonly aliases: ReadonlyMap<string, string>;
  readonly cts: readonly PatientCt[];
  readonly doseGrids: readonly DoseGrid[];
}

/** Reads a run's inputs; the first that cannot be used refuses the run with its issues. */
export function loadCheckInputs(o: CheckRequest): Result<CheckInputs> {
  const loaded = loadBeamData(o.beamData);
  if (!loaded.ok) return loaded;
  const policy = loadPolicy(o.policy);
  if (!policy.ok) return policy;
  const ct = o.ct ? loadPatientCts(o.ct, o.density, o.bodyThreshold ?? policy.value.ct.bodyThresholdHu, o.structures) : undefined;
  if (ct && !ct.ok) return ct;
  const doseGrids: DoseGrid[] = [];
  for (const f of o.dose ?? []) {
    const g = readRtDose(f);
    if (!g.ok) return g;
    doseGrids.push(g.value);
  }
  const aliases = new Map(o.machineAlias.map((a) => a.split('=') as [string, string]));
  return {
    ok: true,
    value: { machine: loaded.value, warnings: loaded.warnings ?? [], policy: policy.value, aliases, cts: ct?.value ?? [], doseGrids },
  };
}
