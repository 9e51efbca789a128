/**
 * From the last object leaving storescu to the verdict in the history: a four-field plan with its
 * 120-slice 512 × 512 CT and its RT Dose, and the two-arc VMAT plan the same, sent by dcmtk's
 * storescu (one association, CT and dose first, the plan last) to `plumbline receive` (the built
 * command, settle time 0, already running: a small plan of its own is checked first), the history on
 * SQLite and on PostgreSQL (a throwaway server). Target: under one second. Best and median of 3 runs
 * each. Run: npm run bench
 */
import { type ChildProcess, spawn, spawnSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { freePort, writeServiceConfig } from '../lib/service-files.js';
import { importPlanFile } from '../../src/dicom/index.js';
import { openHistoryStore } from '../../src/service/history/open-store.js';
import type { HistoryConfig } from '../../src/service/config.js';
import { writeCtPhantom } from '../fixtures/ct-phantom.js';
import { coordinatesDoseReference, planDataset, staticBeam } from '../fixtures/plan-parts.js';
import { writeRtDose } from '../fixtures/rt-dose.js';
import { writeSingleFieldPlan } from '../fixtures/single-field-plan.js';
import { fixtureUid, RT_PLAN_STORAGE, writeDataset } from '../lib/dcmjs-writer.js';
import { startThrowawayPostgres } from '../lib/throwaway-postgres.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const RUNS = 3;
const NODELAY = { ...process.env, TCP_NODELAY: '1' };
const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

/** A small plan of its own frame, sent first: the service has been running (its code compiled) when the measured plan comes. */
function warmUp(dir: string): string {
  const file = join(dir, 'warm-up.dcm');
  writeSingleFieldPlan(file, { id: 'BENCH-WARM', label: 'WARM UP', patientName: 'Bench^Warm Up' });
  return file;
}

/** A plan's companions in its frame of reference: a 120-slice water cylinder CT and a plan RT Dose. */
function companions(dir: string, frame: string, planUid: string): string[] {
  const ct = writeCtPhantom(join(dir, 'ct'), {
    name: `bench-${frame}`,
    columns: 512,
    rows: 512,
    slices: 120,
    spacingMm: [1, 1, 2.5],
    originMm: [-255.5, -255.5, -148.75],
    frameOfReferenceUid: frame,
    hu: (x, y) => (x * x + y * y < 150 * 150 ? 0 : -1000),
  });
  const dose = join(dir, 'dose.dcm');
  writeRtDose(dose, {
    name: `bench-${frame}`,
    planSopInstanceUid: planUid,
    frameOfReferenceUid: frame,
    summation: 'PLAN',
    columns: 100,
    rows: 100,
    frames: 60,
    spacingMm: 3,
    originMm: [-148.5, -148.5, -88.5],
    doseGy: () => 2,
  });
  return [...ct, dose];
}

/** A four-field box on the cylinder's axis (SSD 850 mm from every side), written as a planning system exports it. */
function fourField(dir: string): { files: string[]; label: string } {
  const frame = fixtureUid('bench-four-field-frame');
  const iso: [number, number, number] = [0, 0, 0];
  const plan = join(dir, 'plan.dcm');
  const ds = planDataset({
    file: 'plan.dcm',
    patientId: 'BENCH-4F',
    patientName: 'Bench^Four Field',
    label: 'BENCH 4F',
    name: 'bench',
    description: 'bench',
    doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 2)],
    fractionGroups: [
      { number: 1, fractions: 1, prescriptionGy: 2, beams: [1, 2, 3, 4].map((n) => ({ number: n, mu: 70, doseGy: 0.5, specPoint: iso })) },
    ],
    beams: [0, 90, 180, 270].map((g, k) => staticBeam(k + 1, `G${g}`, 6, g, 850, iso)),
  });
  ds.FrameOfReferenceUID = frame;
  writeDataset(plan, ds, RT_PLAN_STORAGE);
  return { files: [...companions(dir, frame, String(ds.SOPInstanceUID)), plan], label: 'four-field plan + 120-slice CT + RT Dose' };
}

function vmat(dir: string): { files: string[]; label: string } {
  const plan = join(ROOT, 'fixtures/demo/plans/two-arc-vmat.dcm');
  const p = importPlanFile(plan);
  if (!p.ok) throw new Error('the demo VMAT plan cannot be read');
  return {
    files: [...companions(dir, p.value.plan.frameOfReferenceUid!, p.value.plan.sopInstanceUid), plan],
    label: 'two-arc VMAT plan + 120-slice CT + RT Dose',
  };
}

async function once(files: readonly string[], history: HistoryConfig, work: string): Promise<number> {
  const port = await freePort();
  const config = writeServiceConfig(join(work, 'service.json'), {
    receiver: { port, aeTitle: 'PLUMBLINE', allowedCallingAeTitles: ['NG_TPS'] },
    history,
    ct: { density: join(ROOT, 'fixtures/demo/ct/hu-to-density.csv') },
    settleSeconds: 0,
  });
  const receiver: ChildProcess = spawn(process.execPath, [join(ROOT, 'dist/plumbline.mjs'), 'receive', '--config', config], {
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let log = '';
  receiver.stderr!.on('data', (d) => (log += d));
  while (!log.includes('receiving as PLUMBLINE')) await sleep(20);
  const store = await openHistoryStore(history);
  if (!store.ok) throw new Error(store.issues.map((i) => i.message).join('; '));
  try {
    const send = (f: readonly string[]) =>
      spawnSync('storescu', ['-aet', 'NG_TPS', '-aec', 'PLUMBLINE', '127.0.0.1', String(port), ...f], { env: NODELAY });
    send([warmUp(work)]);
    while (!(await store.value.listChecks()).length) await sleep(20);
    const sent = spawn('storescu', ['-aet', 'NG_TPS', '-aec', 'PLUMBLINE', '127.0.0.1', String(port), ...files], { env: NODELAY });
    await new Promise<void>((done, fail) => sent.on('exit', (code) => (code === 0 ? done() : fail(new Error(`storescu exited ${code}`)))));
    const t0 = process.hrtime.bigint();
    while ((await store.value.listChecks()).length < 2) {
      if (Number(process.hrtime.bigint() - t0) > 30e9) throw new Error(`no check recorded in 30 s:\n${log}`);
      await sleep(5);
    }
    const ms = Number(process.hrtime.bigint() - t0) / 1e6;
    if (process.env.PLUMBLINE_BENCH_LOG) console.log(log, new Date().toISOString(), ms);
    return ms;
  } finally {
    await store.value.close();
    receiver.kill('SIGTERM');
    await new Promise((r) => receiver.on('exit', r));
  }
}

const root = mkdtempSync(join(tmpdir(), 'plumbline-bench-latency-'));
const pg = startThrowawayPostgres();
try {
  if (spawnSync('storescu', ['--version']).error) throw new Error('storescu (dcmtk) is needed');
  let db = 0;
  for (const make of process.env.PLUMBLINE_BENCH_ONLY === 'vmat' ? [vmat] : [fourField, vmat]) {
    const dir = join(root, make.name);
    mkdirSync(dir, { recursive: true });
    const inputs = make(dir);
    for (const kind of ['sqlite', 'postgres'] as const) {
      const ms: number[] = [];
      for (let r = 0; r < RUNS; r++) {
        const work = join(root, `${make.name}-${kind}-${r}`);
        mkdirSync(work);
        const history: HistoryConfig =
          kind === 'sqlite' ? { kind, file: join(work, 'history.sqlite') } : { kind, url: await pg.newDatabase(`bench_${++db}`) };
        ms.push(await once(inputs.files, history, work));
      }
      ms.sort((a, b) => a - b);
      console.log(
        `${inputs.label}, history on ${kind}: last object sent → verdict recorded in ${ms[0]!.toFixed(0)} ms (median ${ms[1]!.toFixed(0)} ms; target < 1000 ms)`,
      );
    }
  }
} finally {
  pg.stop();
  rmSync(root, { recursive: true, force: true });
}
