/**
 * A worker of a large `check` batch: loads the beam data and policy itself, checks its share of the
 * files (without CT or RT Dose: batches with them stay in one thread) and posts each result back.
 */
import { parentPort, workerData } from 'node:worker_threads';
import { loadBeamData } from './beam-data.js';
import { InternalError } from '../errors.js';
import type { HeterogeneityMethod } from '../physics/index.js';
import { checkFile, type FileOutcome } from './check-file.js';
import type { CollectedFile } from './collect-files.js';
import { loadPolicy } from './policy-file.js';

export interface WorkerJob {
  readonly manifest: string;
  readonly policyFile?: string;
  readonly aliases: [string, string][];
  readonly point?: [number, number, number];
  readonly suggestPoint: boolean;
  readonly explain?: boolean;
  readonly heterogeneity: HeterogeneityMethod;
  readonly files: CollectedFile[];
}

/** One file's result (k: its place in the share), sent as soon as it is checked; then `done`. */
export type WorkerMessage = { readonly done?: undefined; readonly k: number; readonly result: FileOutcome } | { readonly done: true };

const job = workerData as WorkerJob;
const machine = loadBeamData(job.manifest);
const policy = loadPolicy(job.policyFile);
// The main thread loaded the same files a moment ago: failing here is not an input problem.
if (!machine.ok || !policy.ok) throw new InternalError('the beam data or policy could not be loaded in a worker');
const aliases = new Map(job.aliases);
// Sent one by one, so the main thread takes in results while this one checks the next files.
job.files.forEach((f, k) => {
  const result = checkFile(f, {
    machine: machine.value.machine,
    policy: policy.value,
    aliases,
    ...(job.point ? { pointPatientMm: job.point } : {}),
    suggestPoint: job.suggestPoint,
    ...(job.explain ? { explainAll: true } : {}),
    heterogeneity: job.heterogeneity,
    cts: [],
    singlePlan: false,
  });
  parentPort!.postMessage({ k, result } satisfies WorkerMessage);
});
parentPort!.postMessage({ done: true } satisfies WorkerMessage);
