/**
 * `plumbline inspect` as a user runs it: the summary, the versioned JSON document, exit codes and
 * one line per problem on stderr without a stack trace.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { InspectDocument } from '../../src/report/inspect-json.js';
import { runPython } from '../../scripts/lib/find-python.js';
import { DEMO_DIR, demoPlan } from '../helpers/fixtures.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const plumbline = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', ...args], { cwd: ROOT, encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
const samples = runPython('import pydicom, os; print(os.path.join(os.path.dirname(pydicom.__file__), "data", "test_files"))').trim();

describe('plumbline inspect', () => {
  it('summarises every demo plan in a folder, with the caution, and exits 0', () => {
    const r = plumbline('inspect', DEMO_DIR);
    expect(r.status).toBe(0);
    expect(r.stdout.match(/^RT Plan "/gm)).toHaveLength(6);
    expect(r.stdout).toMatch(/fraction group 2 "boost": 5 fractions/);
    expect(r.stdout).toMatch(/W45 45° standard/);
    expect(r.stdout).toMatch(/an aid to, never a replacement for, the review of a qualified medical physicist/);
  });

  it('prints one versioned JSON document that its schema accepts', () => {
    const r = plumbline('inspect', '--json', demoPlan('two-arc-vmat.dcm'));
    expect(r.status).toBe(0);
    const doc = InspectDocument.parse(JSON.parse(r.stdout));
    expect(doc.schemaVersion).toBe(1);
    expect(doc.plans[0]!.plan.beams.map((b) => b.controlPoints.length)).toEqual([178, 178]);
  });

  it('exits 2 with one line per problem and no stack trace when a file cannot be read faithfully', () => {
    const r = plumbline('inspect', demoPlan('wedged-pair.dcm'), `${samples}/rtplan_truncated.dcm`, `${samples}/CT_small.dcm`);
    expect(r.status).toBe(2);
    const lines = r.stderr.trim().split('\n');
    expect(lines).toHaveLength(2);
    expect(lines[0]).toMatch(/rtplan_truncated\.dcm: the file .* ends before the data it declares.*\[truncated\]$/);
    expect(lines[1]).toMatch(/CT_small\.dcm: SOPClassUID: not an RT Plan: the file is CT Image Storage/);
    expect(r.stderr).not.toMatch(/\n\s+at /);
    expect(r.stdout).toMatch(/RT Plan "PAROTID WP"/);
  });

  it('exits 2 on a usage error', () => {
    expect(plumbline('inspect').status).toBe(2);
  });
});
