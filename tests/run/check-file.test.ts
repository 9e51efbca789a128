/** One file of a run: a plan checked under the SHA-256 of its bytes; in a folder, other study objects and plain non-DICOM files left aside, each said. */
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEFAULT_POLICY } from '../../src/check/policy.js';
import { checkFile } from '../../src/run/check-file.js';
import { loadPatientCts } from '../../src/run/patient-cts.js';
import { demoPlan } from '../helpers/fixtures.js';
import { DEMO_MANIFEST, machine, manifestPath } from '../helpers/machines.js';

const options = {
  machine: machine(DEMO_MANIFEST),
  policy: DEFAULT_POLICY,
  aliases: new Map<string, string>(),
  suggestPoint: false,
  cts: [],
  singlePlan: false,
};
const dir = mkdtempSync(join(tmpdir(), 'plumbline-file-'));

describe('checkFile', () => {
  it('a plan: checked, its result carrying the SHA-256 of its bytes', () => {
    const f = demoPlan('four-field-box.dcm');
    const r = checkFile({ path: f, explicit: true }, options);
    expect(r.refused).toEqual([]);
    expect(r.plan!.fileSha256).toBe(createHash('sha256').update(readFileSync(f)).digest('hex'));
  });
  it('in a folder, a CT slice is left aside as "not an RT Plan (CT Image Storage)"; named on purpose it is refused', () => {
    const ct = manifestPath('fixtures/demo/clinic-ct/pelvis-box/pelvis-0000.dcm');
    expect(checkFile({ path: ct, explicit: false }, options)).toEqual({
      refused: [],
      skipped: { file: ct, reason: 'not an RT Plan (CT Image Storage)' },
    });
    expect(checkFile({ path: ct, explicit: true }, options).refused[0]!.code).toBe('not-rt-plan');
  });
  it('in a folder, a text file is left aside; a broken .dcm is refused', () => {
    const txt = join(dir, 'notes.txt');
    const dcm = join(dir, 'broken.dcm');
    writeFileSync(txt, 'notes');
    writeFileSync(dcm, 'notes');
    expect(checkFile({ path: txt, explicit: false }, options).skipped?.reason).toBe('not a DICOM file');
    expect(checkFile({ path: dcm, explicit: false }, options).refused[0]!.code).toBe('not-dicom');
  });
  it('a path collected as unreadable is refused with its reason; a special file is skipped', () => {
    expect(checkFile({ path: 'x', explicit: true, problem: { kind: 'refuse', reason: 'a link to nothing' } }, options).refused[0]!.message).toBe(
      'a link to nothing',
    );
    expect(checkFile({ path: 'y', explicit: false, problem: { kind: 'skip', reason: 'a FIFO' } }, options).skipped).toEqual({
      file: 'y',
      reason: 'a FIFO',
    });
  });
  it('CT series given, none in the plan’s frame of reference: checked without, and said', () => {
    const cts = loadPatientCts([manifestPath('fixtures/demo/clinic-ct/pelvis-box')], 'demo', -400);
    if (!cts.ok) throw new Error('no CT');
    const r = checkFile({ path: demoPlan('four-field-box.dcm'), explicit: true }, { ...options, cts: cts.value });
    expect(r.plan!.warnings.map((w) => w.code)).toContain('no-ct-in-frame');
  });
});
