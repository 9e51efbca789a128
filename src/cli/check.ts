import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';
import cliProgress from 'cli-progress';
import { z } from 'zod';
import { loadMachine } from '../beamdata/index.js';
import { readRtDose } from '../dicom/index.js';
import type { DoseGrid, Issue, PlanCheck } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { checkHtml } from '../report/check-html.js';
import { checkText } from '../report/check-text.js';
import { writeFileAtomic } from './atomic-write.js';
import { resolveBeamDataPath } from './beam-data-path.js';
import { collectFiles } from './collect-files.js';
import { checkDocument, loadPolicy } from './check-document.js';
import { checkFile } from './check-file.js';
import type { WorkerJob, WorkerMessage } from './check-worker.js';
import { loadPatientCts } from './patient-ct.js';
import type { CommandOutcome } from './outcome.js';

const Point = z.string().transform((s, ctx) => {
  const parts = s.split(',').map((v) => Number(v.trim()));
  if (parts.length !== 3 || parts.some((v) => !Number.isFinite(v))) {
    ctx.addIssue({ code: 'custom', message: `--point must be x,y,z in mm (patient coordinates), found "${s}"` });
    return z.NEVER;
  }
  return parts as [number, number, number];
});

export const CheckOptionsSchema = z.object({
  beamData: z.string().min(1),
  policy: z.string().min(1).optional(),
  point: Point.optional(),
  machineAlias: z.array(z.string().regex(/^[^=]+=[^=]+$/, '--machine-alias must be PLANNAME=DATANAME')).default([]),
  json: z.boolean().default(false),
  html: z.string().min(1).optional(),
  suggestPoint: z.boolean().default(false),
  ct: z.array(z.string().min(1)).optional(),
  dose: z.array(z.string().min(1)).optional(),
  structures: z.string().min(1).optional(),
  density: z.string().min(1).optional(),
  heterogeneity: z.enum(['tpr-ratio', 'batho'], { message: '--heterogeneity must be tpr-ratio or batho' }).default('tpr-ratio'),
  bodyThreshold: z.string().regex(/^-?\d+$/, '--body-threshold must be an integer HU').transform(Number).optional(),
  threads: z.string().regex(/^[1-9]\d*$/, '--threads must be a whole number of at least 1').transform(Number)
    .refine((n) => n <= 64, '--threads must be at most 64').optional(),
});

/** From this many files a batch without CT or dose is shared among worker threads. */
const POOL_FROM_FILES = 200;
const MAX_THREADS = 4;

/** The worker's module beside this one: TypeScript under tsx, the bundle's own file once built. */
function workerUrl(): URL {
  for (const rel of ['./check-worker.ts', './check-worker.mjs', '../check-worker.mjs']) {
    const u = new URL(rel, import.meta.url);
    if (existsSync(fileURLToPath(u))) return u;
  }
  throw new Error('the check worker module is missing from the installation');
}

/** Runs one worker over its share; each file's result arrives as soon as it is checked (k: its place in the share). */
function runWorker(job: WorkerJob, onResult: (k: number, r: ReturnType<typeof checkFile>) => void): Promise<void> {
  return new Promise((resolvePromise, reject) => {
    const url = workerUrl();
    // Under tsx (tests, development) the worker registers tsx's loader before loading TypeScript.
    const w = url.pathname.endsWith('.ts')
      ? new Worker(`import('tsx/esm/api').then((api) => { api.register(); return import(${JSON.stringify(url.href)}); });`, { eval: true, workerData: job })
      : new Worker(url, { workerData: job });
    w.on('message', (m: WorkerMessage) => (m.done ? resolvePromise() : onResult(m.k, m.result)));
    w.once('error', reject);
    w.once('exit', (code) => { if (code !== 0) reject(new Error(`a check worker stopped with code ${code}`)); });
  });
}

/** `plumbline check`: read every plan, check it against the beam data, report; batch runs go on past bad files. */
export async function runCheck(paths: readonly string[], raw: Record<string, unknown>): Promise<CommandOutcome> {
  const parsed = CheckOptionsSchema.safeParse(raw);
  if (!parsed.success) return refuse(parsed.error.issues.map((i) => ({ severity: 'error', code: 'invalid-option', message: i.message })));
  const o = parsed.data;
  const loaded = loadMachine(resolveBeamDataPath(o.beamData));
  if (!loaded.ok) return refuse(loaded.issues);
  const policy = loadPolicy(o.policy);
  if (!policy.ok) return refuse(policy.issues);
  const aliases = new Map(o.machineAlias.map((a) => a.split('=') as [string, string]));
  const ct = o.ct ? loadPatientCts(o.ct, o.density, o.bodyThreshold ?? policy.value.ct.bodyThresholdHu, o.structures) : undefined;
  if (ct && !ct.ok) return refuse(ct.issues);
  const doseGrids: DoseGrid[] = [];
  for (const f of o.dose ?? []) {
    const g = readRtDose(f);
    if (!g.ok) return refuse(g.issues);
    doseGrids.push(g.value);
  }

  const files = collectFiles(paths);
  const bar = process.stderr.isTTY && files.length > 1 ? new cliProgress.SingleBar({ stream: process.stderr, format: 'checking {bar} {value}/{total} files' }, cliProgress.Presets.shades_classic) : undefined;
  bar?.start(files.length, 0);
  const plans: PlanCheck[] = [];
  const refused: Issue[] = [];
  const cts = ct?.ok ? ct.value : [];
  // A large batch without CT or RT Dose is shared among worker threads, one per core (or --threads).
  const threads = Math.min(o.threads ?? Math.min(availableParallelism(), MAX_THREADS), files.length);
  if (!cts.length && !doseGrids.length && files.length >= POOL_FROM_FILES && threads > 1) {
    // Dealt in turn, so long plans (arcs) are shared too; results go back into file order.
    const shares = Array.from({ length: threads }, (_, k) => files.filter((_f, i) => i % threads === k));
    const results: ReturnType<typeof checkFile>[] = new Array(files.length);
    await Promise.all(shares.map((share, t) => runWorker({ manifest: loaded.value.manifestFile, ...(o.policy ? { policyFile: o.policy } : {}), aliases: [...aliases],
      ...(o.point ? { point: o.point } : {}), suggestPoint: o.suggestPoint, heterogeneity: o.heterogeneity, files: share }, (k, r) => {
      results[k * threads + t] = r;
      bar?.increment();
    })));
    for (const r of results) {
      if (r.plan) plans.push(r.plan);
      refused.push(...r.refused);
    }
    bar?.update(files.length);
  } else {
    for (const f of files) {
      bar?.increment();
      const r = checkFile(f, { machine: loaded.value.machine, policy: policy.value, aliases, ...(o.point ? { pointPatientMm: o.point } : {}), suggestPoint: o.suggestPoint,
        heterogeneity: o.heterogeneity, ...(doseGrids.length ? { doseGrids } : {}), cts, singlePlan: files.length === 1 });
      if (r.plan) plans.push(r.plan);
      refused.push(...r.refused);
    }
  }
  bar?.stop();
  if (plans.length === 0 && refused.length === 0) refused.push({ severity: 'error', code: 'missing-attribute', message: `no RT Plan found in ${paths.join(', ')}` });

  const doc = checkDocument(plans, refused, loaded.value, policy.value);
  const stderr = loaded.warnings.map(formatIssue);
  if (o.html) {
    try {
      writeFileAtomic(o.html, checkHtml(doc));
      stderr.push(`wrote ${o.html}`);
    } catch (e) {
      return refuse([{ severity: 'error', code: 'unreadable', file: o.html, message: `cannot write the HTML report (${(e as NodeJS.ErrnoException).code ?? String(e)})` }]);
    }
  }
  const inputError = refused.length > 0 || plans.some((p) => p.issues.length > 0);
  const review = plans.some((p) => p.verdict !== 'within tolerance' || !p.fullyVerified);
  const exitCode = inputError ? 2 : review ? 1 : 0;
  return { stdout: o.json ? [JSON.stringify(doc, null, 2)] : checkText(doc), stderr: [...stderr, ...refused.map(formatIssue)], exitCode };
}

function refuse(issues: readonly Issue[]): CommandOutcome {
  return { stdout: [], stderr: issues.map(formatIssue), exitCode: 2 };
}
