/**
 * The file `npm install` puts on the PATH is the esbuild bundle (dist/plumbline.mjs, built by
 * `npm run build`, which `npm test` runs first): it must work on its own, with its own paths.
 */
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { Policy } from '../../src/check/index.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const BUNDLE = fileURLToPath(new URL('../../dist/plumbline.mjs', import.meta.url));
const run = (...args: string[]) => spawnSync(process.execPath, [BUNDLE, ...args], { cwd: ROOT, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });

describe('the bundled command', () => {
  it('is built', () => expect(existsSync(BUNDLE)).toBe(true));
  it('knows its version and finds the demo machine from anywhere', () => {
    expect(run('--version').stdout.trim()).toMatch(/^\d+\.\d+\.\d+$/);
    const r = spawnSync(process.execPath, [BUNDLE, 'beams', 'validate', 'demo'], { cwd: tmpdir(), encoding: 'utf8' });
    expect(r.status).toBe(0);
  });
  it('reads the demo plans (dicom-parser requires zlib at load: the bundle must provide require)', () => {
    const r = run('inspect', 'fixtures/demo/plans');
    expect(r.status).toBe(0);
    expect(r.stdout.match(/^RT Plan "/gm)).toHaveLength(6);
  });
  it('checks the demo clinic (exit 1: a plan flagged on purpose) and prints the shipped policy', () => {
    expect(run('check', 'fixtures/demo/clinic', '--beam-data', 'demo').status).toBe(1);
    expect(Policy.safeParse(JSON.parse(run('policy').stdout)).success).toBe(true);
  });
});
