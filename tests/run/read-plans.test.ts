/** Plans read from files and folders: other objects in a folder skipped with a note, a file named on purpose refused when it is no plan. */
import { copyFileSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readPlans } from '../../src/run/read-plans.js';
import { importOrThrow } from '../helpers/check-run.js';
import { demoPlan } from '../helpers/fixtures.js';
import { manifestPath } from '../helpers/machines.js';

const CT_SLICE = manifestPath('fixtures/demo/clinic-ct/pelvis-box/pelvis-0000.dcm');

describe('readPlans', () => {
  it('a folder: its plans read; a CT slice and a text file skipped with notes', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-read-'));
    mkdirSync(join(dir, 'sub'));
    copyFileSync(demoPlan('four-field-box.dcm'), join(dir, 'a.dcm'));
    copyFileSync(demoPlan('wedged-pair.dcm'), join(dir, 'sub', 'b.dcm'));
    copyFileSync(CT_SLICE, join(dir, 'ct.dcm'));
    writeFileSync(join(dir, 'notes.txt'), 'to be treated on Monday\n');
    const r = readPlans([dir]);
    expect(r.plans.map((p) => p.imported.plan.sopInstanceUid).sort()).toEqual(
      ['four-field-box.dcm', 'wedged-pair.dcm'].map((f) => importOrThrow(demoPlan(f)).sopInstanceUid).sort(),
    );
    expect(r.problems).toEqual([]);
    expect(r.notes.some((n) => n.startsWith(`skipped ${join(dir, 'ct.dcm')}: not an RT Plan`))).toBe(true);
    expect(r.notes).toContain('skipped 1 file(s) in the folder(s) that are not DICOM');
  });
  it('a CT slice named on purpose is a problem, not a note', () => {
    const r = readPlans([CT_SLICE]);
    expect(r.plans).toEqual([]);
    expect(r.problems[0]!.code).toBe('not-rt-plan');
  });
  it('a folder with no plan: "no RT Plan found"', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-read-'));
    expect(readPlans([dir]).problems[0]!.message).toBe(`no RT Plan found in ${dir}`);
  });
});
