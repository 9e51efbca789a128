/**
 * CT loading: a 200-slice 512 × 512 series (a water cylinder phantom, written here) loaded and traced
 * for a four-field plan (4 rays) and a two-arc plan (356 rays, one per control point), against `cat`
 * and pydicom reading the same files with pixel data in the same run; peak memory against the Int16
 * volume plus Node's baseline. Run: npm run bench
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { writeCtPhantom } from '../fixtures/ct-phantom.js';
import { findPythonWithPydicom } from '../lib/find-python.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const dir = mkdtempSync(join(tmpdir(), 'plumbline-bench-ct-'));
const seconds = (cmd: string, args: string[]) => {
  const t0 = process.hrtime.bigint();
  const r = spawnSync(cmd, args, { stdio: ['ignore', 'pipe', 'pipe'], maxBuffer: 64 * 1024 * 1024, encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`${cmd} failed: ${r.stderr}`);
  return { s: Number(process.hrtime.bigint() - t0) / 1e9, stdout: r.stdout, stderr: r.stderr };
};
try {
  writeCtPhantom(dir, {
    name: 'bench',
    columns: 512,
    rows: 512,
    slices: 200,
    spacingMm: [1, 1, 2],
    originMm: [-255.5, -255.5, -199],
    frameOfReferenceUid: '1.2.3.4',
    hu: (x, y) => (x * x + y * y < 150 * 150 ? 20 : -1000),
  });
  seconds('sh', ['-c', `cat ${dir}/*.dcm > /dev/null`]); // warm the page cache
  const cat = Math.min(...[0, 1, 2].map(() => seconds('sh', ['-c', `cat ${dir}/*.dcm > /dev/null`]).s));
  const runs = [0, 1, 2].map(() =>
    seconds('/usr/bin/time', ['-f', '%M', process.execPath, '--import', 'tsx', join(ROOT, 'scripts/bench/ct-load.ts'), dir]),
  );
  const best = runs
    .map((r) => ({
      ...(JSON.parse(r.stdout) as { loadMs: number; fourFieldTraceMs: number; twoArcTraceMs: number; volumeBytes: number }),
      peakKb: Number(r.stderr.trim().split('\n').pop()),
    }))
    .sort((a, b) => a.loadMs - b.loadMs)[0]!;
  const baseline = Number(seconds('/usr/bin/time', ['-f', '%M', process.execPath, '--import', 'tsx', '-e', '0']).stderr.trim().split('\n').pop());
  const python = findPythonWithPydicom();
  const pyCode =
    'import sys, glob, time, pydicom\nt = time.time()\nfor f in glob.glob(sys.argv[1] + "/*.dcm"): pydicom.dcmread(f).pixel_array\nprint(time.time() - t)';
  const py = python ? Math.min(...[0, 1].map(() => Number(seconds(python, ['-c', pyCode, dir]).stdout))) : Number.NaN;
  const load = best.loadMs / 1000;
  console.log(
    `CT 200 x 512 x 512: load ${(1000 * load).toFixed(0)} ms, cat ${(1000 * cat).toFixed(0)} ms: ratio ${(load / cat).toFixed(1)}x (target <= 3x); pydicom with pixel data ${(1000 * py).toFixed(0)} ms: plumbline / pydicom = ${(load / py).toFixed(2)} (target < 1)`,
  );
  console.log(`trace: four-field plan ${best.fourFieldTraceMs.toFixed(1)} ms (4 rays), two-arc plan ${best.twoArcTraceMs.toFixed(1)} ms (356 rays)`);
  console.log(
    `peak memory ${(best.peakKb / 1024).toFixed(0)} MiB; Int16 volume ${(best.volumeBytes / 2 ** 20).toFixed(0)} MiB + Node baseline ${(baseline / 1024).toFixed(0)} MiB = ${((best.volumeBytes / 1024 + baseline) / 1024).toFixed(0)} MiB; target <= 1.5 x volume + baseline = ${(((1.5 * best.volumeBytes) / 1024 + baseline) / 1024).toFixed(0)} MiB`,
  );
} finally {
  rmSync(dir, { recursive: true, force: true });
}
