import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import { InternalError } from '../errors.js';
import type { Issue, PlanCheck } from '../model/index.js';
import type { CheckInputs, CheckRequest } from './check-inputs.js';
import { checkFile, type FileOutcome } from './check-file.js';
import type { CollectedFile } from './collect-files.js';
import type { WorkerJob, WorkerMessage } from './check-worker.js';

/** From this many files a batch without CT or dose is shared among worker threads. */
const POOL_FROM_FILES = 200;
const MAX_THREADS = 4;

/**
 * Every file of a run checked, in file order; `onFile` is told as each is done (for a progress
 * bar). A large batch without CT or RT Dose is shared among worker threads, one per core (or
 * `threads`), each running the same `checkFile`.
 */
export async function checkFiles(
  files: readonly CollectedFile[],
  inputs: CheckInputs,
  o: CheckRequest,
  onFile: () => void,
): Promise<{ plans: PlanCheck[]; refused: Issue[]; skipped: NonNullable<FileOutcome['skipped']>[] }> {
  const threads = Math.min(o.threads ?? Math.min(availableParallelism(), MAX_THREADS), files.length);
  const pooled = !inputs.cts.length && !inputs.doseGrids.length && files.length >= POOL_FROM_FILES && threads > 1;
  const results = pooled
    ? await checkInWorkers(files, inputs, o, threads, onFile)
    : files.map((f) => {
        const r = checkFile(f, {
          machine: inputs.machine.machine,
          policy: inputs.policy,
          aliases: inputs.aliases,
          ...(o.point ? { pointPatientMm: o.point } : {}),
          suggestPoint: o.suggestPoint,
          ...(o.explain ? { explainAll: true } : {}),
          heterogeneity: o.heterogeneity,
          ...(inputs.doseGrids.length ? { doseGrids: inputs.doseGrids } : {}),
          cts: inputs.cts,
          singlePlan: files.length === 1,
        });
        onFile();
        return r;
      });
  return {
    plans: results.flatMap((r) => (r.plan ? [r.plan] : [])),
    refused: results.flatMap((r) => r.refused),
    skipped: results.flatMap((r) => (r.skipped ? [r.skipped] : [])),
  };
}

/** The files dealt in turn to the threads, so long plans (arcs) are shared too; results go back into file order. */
async function checkInWorkers(
  files: readonly CollectedFile[],
  inputs: CheckInputs,
  o: CheckRequest,
  threads: number,
  onFile: () => void,
): Promise<FileOutcome[]> {
  const shares = Array.from({ length: threads }, (_, k) => files.filter((_f, i) => i % threads === k));
  const results: FileOutcome[] = new Array(files.length);
  await Promise.all(
    shares.map((share, t) =>
      runWorker(
        {
          manifest: inputs.machine.manifestFile,
          ...(o.policy ? { policyFile: o.policy } : {}),
          aliases: [...inputs.aliases],
          ...(o.point ? { point: o.point } : {}),
          suggestPoint: o.suggestPoint,
          ...(o.explain ? { explain: true } : {}),
          heterogeneity: o.heterogeneity,
          files: share,
        },
        (k, r) => {
          results[k * threads + t] = r;
          onFile();
        },
      ),
    ),
  );
  return results;
}

/** The worker's module beside this one: TypeScript under tsx, the bundle's own file once built. */
function workerUrl(): URL {
  for (const rel of ['./check-worker.ts', './check-worker.mjs', '../check-worker.mjs']) {
    const u = new URL(rel, import.meta.url);
    if (existsSync(fileURLToPath(u))) return u;
  }
  throw new InternalError('the check worker module is missing from the installation');
}

/** Runs one worker over its share; each file's result arrives as soon as it is checked (k: its place in the share). */
function runWorker(job: WorkerJob, onResult: (k: number, r: FileOutcome) => void): Promise<void> {
  return new Promise((resolvePromise, reject) => {
    const url = workerUrl();
    // Under tsx (tests, development) the worker registers tsx's loader before loading TypeScript.
    const w = url.pathname.endsWith('.ts')
      ? new Worker(`import('tsx/esm/api').then((api) => { api.register(); return import(${JSON.stringify(url.href)}); });`, {
          eval: true,
          workerData: job,
        })
      : new Worker(url, { workerData: job });
    w.on('message', (m: WorkerMessage) => (m.done ? resolvePromise() : onResult(m.k, m.result)));
    w.once('error', reject);
    w.once('exit', (code) => {
      if (code !== 0) reject(new Error(`a check worker stopped with code ${code}`));
    });
  });
}
