/**
 * Import speed: 1 000 copies of the four-field plan and 100 of the two-arc plan, read and validated
 * in one process, against dcmtk's dcmdump printing the same files in the same run (one dcmdump
 * process for all of them, output discarded). Prints plans per second and the ratio.
 * Run: npm run bench
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { importPlanFile } from '../../src/dicom/index.js';

const DEMO = fileURLToPath(new URL('../../fixtures/demo/plans/', import.meta.url));
const work = mkdtempSync(join(tmpdir(), 'plumbline-bench-'));

function copies(name: string, n: number): string[] {
  return Array.from({ length: n }, (_, i) => {
    const f = join(work, `${name.replace('.dcm', '')}-${i}.dcm`);
    copyFileSync(join(DEMO, name), f);
    return f;
  });
}

function timeImport(files: readonly string[]): number {
  const t0 = process.hrtime.bigint();
  for (const f of files) {
    const r = importPlanFile(f);
    if (!r.ok) throw new Error(`${f}: ${r.issues[0]?.message}`);
  }
  return Number(process.hrtime.bigint() - t0) / 1e9;
}

function timeDcmdump(files: readonly string[]): number {
  // Split into chunks to stay under the argument-length limit; all chunks in sequence.
  const t0 = process.hrtime.bigint();
  for (let i = 0; i < files.length; i += 500) {
    const r = spawnSync('dcmdump', ['-q', ...files.slice(i, i + 500)], { stdio: ['ignore', 'ignore', 'pipe'] });
    if (r.status !== 0) throw new Error(`dcmdump failed: ${r.stderr}`);
  }
  return Number(process.hrtime.bigint() - t0) / 1e9;
}

try {
  const sets = [
    { label: 'four-field plan', files: copies('four-field-box.dcm', 1000) },
    { label: 'two-arc plan (2 x 178 control points)', files: copies('two-arc-vmat.dcm', 100) },
  ];
  timeImport(sets[0]!.files.slice(0, 200)); // warm-up: JIT and file cache
  timeDcmdump(sets[0]!.files.slice(0, 200));
  for (const { label, files } of sets) {
    const ours = Math.min(...[0, 1, 2].map(() => timeImport(files)));
    const theirs = Math.min(...[0, 1, 2].map(() => timeDcmdump(files)));
    const oursRate = files.length / ours;
    const theirRate = files.length / theirs;
    console.log(
      `${label}: plumbline ${oursRate.toFixed(0)} plans/s (${((ours / files.length) * 1e3).toFixed(3)} ms each), ` +
        `dcmdump ${theirRate.toFixed(0)} plans/s; ratio ${(oursRate / theirRate).toFixed(2)}x (best of 3, ${files.length} files)`,
    );
  }
} finally {
  rmSync(work, { recursive: true, force: true });
}
