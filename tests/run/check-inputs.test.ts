/** What a check run reads before its first plan; the first input that cannot be used refuses the run with its issues. */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEFAULT_POLICY } from '../../src/check/policy.js';
import { type CheckRequest, loadCheckInputs } from '../../src/run/check-inputs.js';
import { manifestPath } from '../helpers/machines.js';

const base: CheckRequest = { beamData: 'demo', machineAlias: ['LINAC-A=NG_LINAC1'], suggestPoint: false, heterogeneity: 'tpr-ratio' };
const dir = mkdtempSync(join(tmpdir(), 'plumbline-inputs-'));

describe('loadCheckInputs', () => {
  it('the demo beam data, the default policy, the machine aliases; no CT, no dose', () => {
    const r = loadCheckInputs(base);
    if (!r.ok) throw new Error(r.issues[0]!.message);
    expect(r.value.machine.machine.name).toBe('NG_LINAC1');
    expect(r.value.policy).toEqual(DEFAULT_POLICY);
    expect([...r.value.aliases]).toEqual([['LINAC-A', 'NG_LINAC1']]);
    expect(r.value.cts).toEqual([]);
    expect(r.value.doseGrids).toEqual([]);
  });
  it('with the demo CT and density table', () => {
    const r = loadCheckInputs({ ...base, ct: [manifestPath('fixtures/demo/clinic-ct/pelvis-box')], density: 'demo' });
    expect(r.ok && r.value.cts).toHaveLength(1);
  });
  it('refused at the first unusable input: beam data, policy, CT without density, an RT Dose that is none', () => {
    expect(loadCheckInputs({ ...base, beamData: join(dir, 'none.json') }).ok).toBe(false);
    const policy = join(dir, 'policy.json');
    writeFileSync(policy, '{ "levels": 3 }');
    expect(loadCheckInputs({ ...base, policy }).ok).toBe(false);
    const noDensity = loadCheckInputs({ ...base, ct: [manifestPath('fixtures/demo/clinic-ct/pelvis-box')] });
    expect(!noDensity.ok && noDensity.issues[0]!.code).toBe('invalid-option');
    const dose = loadCheckInputs({ ...base, dose: [manifestPath('fixtures/demo/clinic/pelvis-box.dcm')] });
    expect(!dose.ok && dose.issues[0]).toMatchObject({ path: 'SOPClassUID', message: 'not an RT Dose' });
  });
});
