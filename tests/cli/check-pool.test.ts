/**
 * A large batch is shared among worker threads: the same results, in the same (file) order, as each
 * plan checked on its own.
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { CheckDocument } from '../../src/report/check-json.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const run = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', ...args], { cwd: ROOT, encoding: 'utf8', maxBuffer: 256 * 1024 * 1024 });
const SOURCES = ['brain-laterals.dcm', 'lung-mlc.dcm', 'prostate-vmat.dcm'].map((f) => join(ROOT, 'fixtures/demo/clinic', f));

describe('a large check batch', () => {
  it('gives every plan the result it gets alone, in file order', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-pool-'));
    for (let i = 0; i < 210; i++) copyFileSync(SOURCES[i % 3]!, join(dir, `p${String(i).padStart(3, '0')}.dcm`));
    const batch = CheckDocument.parse(JSON.parse(run('check', dir, '--beam-data', 'demo', '--json').stdout));
    expect(batch.plans).toHaveLength(210);
    expect(batch.plans.map((p) => p.file)).toEqual([...batch.plans.map((p) => p.file)].sort());
    const alone = SOURCES.map((f) => CheckDocument.parse(JSON.parse(run('check', f, '--beam-data', 'demo', '--json').stdout)).plans[0]!);
    const strip = (p: (typeof alone)[number]) => ({ ...p, file: '' });
    batch.plans.forEach((p, i) => expect(strip(p)).toEqual(strip(alone[i % 3]!)));
    // --threads 1 checks the same batch in one thread, --threads 3 in three: the same document.
    for (const n of ['1', '3']) {
      const other = CheckDocument.parse(JSON.parse(run('check', dir, '--beam-data', 'demo', '--json', '--threads', n).stdout));
      expect(other.plans.map(strip)).toEqual(batch.plans.map(strip));
    }
    const refused = run('check', dir, '--beam-data', 'demo', '--threads', '0');
    expect(refused.status).toBe(2);
    expect(refused.stderr).toMatch(/--threads must be a whole number of at least 1/);
  }, 180_000);
});
