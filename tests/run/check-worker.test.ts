/** A worker of a large batch, run as a real worker thread: each file's result posted as it is checked, then `done`; the same result as the main thread's. */
import { Worker } from 'node:worker_threads';
import { describe, expect, it } from 'vitest';
import { DEFAULT_POLICY } from '../../src/check/policy.js';
import { checkFile } from '../../src/run/check-file.js';
import type { WorkerJob, WorkerMessage } from '../../src/run/check-worker.js';
import { demoPlan } from '../helpers/fixtures.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

const WORKER = new URL('../../src/run/check-worker.ts', import.meta.url).href;
function run(job: WorkerJob): Promise<WorkerMessage[]> {
  return new Promise((resolve, reject) => {
    const messages: WorkerMessage[] = [];
    const w = new Worker(`import('tsx/esm/api').then((api) => { api.register(); return import(${JSON.stringify(WORKER)}); });`, {
      eval: true,
      workerData: job,
    });
    w.on('message', (m: WorkerMessage) => {
      messages.push(m);
      if (m.done) resolve(messages);
    });
    w.once('error', reject);
    w.once('exit', (code) => (code !== 0 ? reject(new Error(`exit ${code}`)) : resolve(messages)));
  });
}
const files = ['four-field-box.dcm', 'wedged-pair.dcm'].map((f) => ({ path: demoPlan(f), explicit: true }));

describe('the check worker', () => {
  it('posts each file with its place in the share, then done; each result the main thread’s own', async () => {
    const messages = await run({ manifest: DEMO_MANIFEST, aliases: [], suggestPoint: false, heterogeneity: 'tpr-ratio', files });
    expect(messages.map((m) => (m.done ? 'done' : m.k))).toEqual([0, 1, 'done']);
    const options = {
      machine: machine(DEMO_MANIFEST),
      policy: DEFAULT_POLICY,
      aliases: new Map(),
      suggestPoint: false,
      heterogeneity: 'tpr-ratio' as const,
      cts: [],
      singlePlan: false,
    };
    files.forEach((f, k) => {
      const m = messages[k]!;
      if (m.done) throw new Error('early done');
      expect(JSON.stringify(m.result)).toBe(JSON.stringify(checkFile(f, options)));
    });
  }, 60_000);
  it('stops with an error when the beam data cannot be loaded (the main thread loaded them a moment before: a bug, not an input)', async () => {
    await expect(run({ manifest: 'no/such/manifest.json', aliases: [], suggestPoint: false, heterogeneity: 'tpr-ratio', files })).rejects.toThrow(
      /could not be loaded in a worker/,
    );
  }, 60_000);
});
