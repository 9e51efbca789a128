/**
 * The check as a user runs it, timed as whole processes in the same run:
 *  1. start-up: `plumbline check` on one four-field plan vs `node -e 0` (median of 20; target <= 3x);
 *  2. batch: 1 000 four-field plans and 100 two-arc plans checked in one process vs dcmtk's dcmdump
 *     printing the same files in one process (target: less than half dcmdump's time).
 * Needs `npm run build` first (npm run bench does it). Run: npm run bench
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const CLI = join(ROOT, 'dist/plumbline.mjs');
const FOUR_FIELD = join(ROOT, 'fixtures/demo/clinic/pelvis-box.dcm');
const TWO_ARC = join(ROOT, 'fixtures/demo/plans/two-arc-vmat.dcm');

function seconds(cmd: string, args: readonly string[]): number {
  const t0 = process.hrtime.bigint();
  const r = spawnSync(cmd, args, { stdio: ['ignore', 'ignore', 'pipe'], maxBuffer: 256 * 1024 * 1024 });
  const s = Number(process.hrtime.bigint() - t0) / 1e9;
  if (r.status !== 0 && r.status !== 1) throw new Error(`${cmd} ${args.slice(0, 3).join(' ')} failed (${r.status}): ${r.stderr}`);
  return s;
}
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

const startup = () => {
  const ours: number[] = [];
  const node: number[] = [];
  for (let i = 0; i < 20; i++) {
    node.push(seconds(process.execPath, ['-e', '0']));
    ours.push(seconds(process.execPath, [CLI, 'check', FOUR_FIELD, '--beam-data', 'demo']));
  }
  return { ours: median(ours), node: median(node) };
};

const work = mkdtempSync(join(tmpdir(), 'plumbline-bench-check-'));
try {
  const s = startup();
  console.log(
    `start-up: plumbline check on one four-field plan ${(s.ours * 1e3).toFixed(0)} ms, node -e 0 ${(s.node * 1e3).toFixed(0)} ms: ratio ${(s.ours / s.node).toFixed(2)}x (median of 20; target <= 3x)`,
  );

  const dir = join(work, 'batch');
  mkdirSync(dir);
  const files: string[] = [];
  for (let i = 0; i < 1000; i++) files.push(join(dir, `ff-${String(i).padStart(4, '0')}.dcm`));
  for (let i = 0; i < 100; i++) files.push(join(dir, `arc-${String(i).padStart(3, '0')}.dcm`));
  files.forEach((f, i) => copyFileSync(i < 1000 ? FOUR_FIELD : TWO_ARC, f));
  seconds('dcmdump', ['-q', ...files.slice(0, 100)]); // warm the file cache
  const ours: number[] = [];
  const theirs: number[] = [];
  for (let k = 0; k < 3; k++) {
    ours.push(seconds(process.execPath, [CLI, 'check', dir, '--beam-data', 'demo']));
    theirs.push(seconds('dcmdump', ['-q', ...files]));
  }
  const o = Math.min(...ours);
  const t = Math.min(...theirs);
  console.log(
    `batch: 1 000 four-field + 100 two-arc plans: plumbline check ${o.toFixed(2)} s (${(files.length / o).toFixed(0)} plans/s), ` +
      `dcmdump ${t.toFixed(2)} s (${(files.length / t).toFixed(0)} plans/s): ratio ${(o / t).toFixed(2)} (best of 3; target < 0.5)`,
  );
  const single = Math.min(...[0, 1].map(() => seconds(process.execPath, [CLI, 'check', dir, '--beam-data', 'demo', '--threads', '1'])));
  console.log(
    `  the same batch in one thread (--threads 1): ${single.toFixed(2)} s: ratio ${(single / t).toFixed(2)}; the worker threads make it ${(single / o).toFixed(2)}x faster`,
  );
  // The same two kinds apart, to show where the time goes.
  for (const [label, prefix, count] of [
    ['1 000 four-field plans alone', 'ff-', 1000],
    ['100 two-arc plans alone', 'arc-', 100],
  ] as const) {
    const part = join(work, prefix);
    mkdirSync(part);
    const partFiles = files.filter((f) => f.startsWith(join(dir, prefix)));
    partFiles.forEach((f) => copyFileSync(f, join(part, f.slice(dir.length + 1))));
    const po = Math.min(...[0, 1].map(() => seconds(process.execPath, [CLI, 'check', part, '--beam-data', 'demo'])));
    const pt = Math.min(...[0, 1].map(() => seconds('dcmdump', ['-q', ...partFiles.map((f) => join(part, f.slice(dir.length + 1)))])));
    console.log(
      `  ${label}: plumbline check ${po.toFixed(2)} s (${((1000 * po) / count).toFixed(1)} ms per plan), dcmdump ${pt.toFixed(2)} s: ratio ${(po / pt).toFixed(2)}`,
    );
  }
} finally {
  rmSync(work, { recursive: true, force: true });
}
