/**
 * The command line's wiring, run as a user runs it (the bundle is tested in bundle.test.ts): its
 * commands listed, its version, an unknown command or option refused with exit 2, a command's
 * outcome written with its exit code, and control characters from the outside never reaching the terminal.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, copyFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { VERSION } from '../../src/run/version.js';
import { demoPlan } from '../helpers/fixtures.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const run = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', ...args], { cwd: ROOT, encoding: 'utf8' });

describe('the command line', () => {
  it('lists its commands in --help (exit 0) and says its version', () => {
    const help = run('--help');
    expect(help.status).toBe(0);
    for (const c of ['inspect', 'check', 'calc', 'depth', 'policy', 'receive', 'watch', 'serve', 'users', 'history', 'beams'])
      expect(help.stdout).toMatch(new RegExp(`^\\s+${c}\\b`, 'm'));
    expect(run('--version').stdout.trim()).toBe(VERSION);
  });
  it('an unknown command or option: exit 2, said on stderr', () => {
    const cmd = run('chekc', 'plan.dcm');
    expect(cmd.status).toBe(2);
    expect(cmd.stderr).toMatch(/unknown command 'chekc'/);
    const opt = run('inspect', 'plan.dcm', '--jsno');
    expect(opt.status).toBe(2);
    expect(opt.stderr).toMatch(/unknown option '--jsno'/);
  });
  it("a command's outcome: inspect of a demo plan, exit 0; a file name with an escape sequence shown harmless", () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-main-'));
    const odd = join(dir, 'plan\u001b[2J.dcm');
    copyFileSync(demoPlan('four-field-box.dcm'), odd);
    const r = run('inspect', odd);
    expect(r.status).toBe(0);
    expect(r.stdout).not.toContain('\u001b');
    expect(r.stdout).toContain('plan\ufffd[2J.dcm');
  });
});
