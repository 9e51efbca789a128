/**
 * A plan arriving at the service with its companions: the CT and RT Doses that can be used, warnings
 * for those that cannot (never a refusal), the machine its plan names, and a content hash that does
 * not depend on the file (the same plan in another transfer syntax, written by dcmtk's dcmconv, is
 * tested in tests/service/duplicates.test.ts).
 */
import { readFileSync, writeFileSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEFAULT_POLICY } from '../../src/check/policy.js';
import { checkArrivedPlan, loadCompanions, planContentSha256 } from '../../src/run/check-arrival.js';
import { loadBeamData } from '../../src/run/beam-data.js';
import { manifestPath } from '../helpers/machines.js';

const PELVIS_PLAN = manifestPath('fixtures/demo/clinic/pelvis-box.dcm');
const PELVIS_CT = manifestPath('fixtures/demo/clinic-ct/pelvis-box');
const demo = (() => {
  const r = loadBeamData('demo');
  if (!r.ok) throw new Error('no demo data');
  return r.value;
})();
const dir = mkdtempSync(join(tmpdir(), 'plumbline-arrival-'));

describe('loadCompanions', () => {
  it('the CT with a density table becomes the patient CT', () => {
    const c = loadCompanions({ ctFiles: [PELVIS_CT], doseFiles: [] }, { density: 'demo' }, DEFAULT_POLICY);
    expect(c.ct?.volume.slices).toBe(68);
    expect(c.warnings).toEqual([]);
  });
  it('a CT without a density table, and an unreadable RT Dose, become warnings', () => {
    const bad = join(dir, 'dose.dcm');
    writeFileSync(bad, 'not an RT Dose');
    const c = loadCompanions({ ctFiles: [PELVIS_CT], doseFiles: [bad] }, undefined, DEFAULT_POLICY);
    expect(c.ct).toBeUndefined();
    expect(c.warnings.map((w) => w.code)).toEqual(['ct-without-density', 'dose-unreadable']);
  });
});

describe('checkArrivedPlan', () => {
  it('the pelvis plan with its CT: checked with the CT, recorded under its hash', () => {
    const companions = loadCompanions({ ctFiles: [PELVIS_CT], doseFiles: [] }, { density: 'demo' }, DEFAULT_POLICY);
    const r = checkArrivedPlan(readFileSync(PELVIS_PLAN), 'pelvis.dcm', 'abc', [demo], DEFAULT_POLICY, companions);
    if (!r.ok) throw new Error(r.issues[0]!.message);
    expect(r.value.machine).toBe(demo);
    expect(r.value.result.file).toBe('sha256:abc');
    const beams = r.value.result.fractionGroups.flatMap((g) => g.beams);
    expect(beams.some((b) => b.status === 'checked' && b.calculation.ct !== undefined)).toBe(true);
  });
  it('bytes that are no plan are refused with the importer’s issue', () => {
    const r = checkArrivedPlan(Buffer.from('nothing'), 'x.dcm', 'abc', [demo], DEFAULT_POLICY, { doseGrids: [], warnings: [] });
    expect(!r.ok && r.issues[0]!.code).toBe('not-dicom');
  });
});

describe('planContentSha256', () => {
  it('the same for the same plan, different for another, undefined for no plan', () => {
    const a = planContentSha256(readFileSync(PELVIS_PLAN), 'a.dcm');
    expect(a).toMatch(/^[0-9a-f]{64}$/);
    expect(planContentSha256(readFileSync(PELVIS_PLAN), 'other-name.dcm')).toBe(a);
    expect(planContentSha256(readFileSync(manifestPath('fixtures/demo/clinic/spine-ssd.dcm')), 'b.dcm')).not.toBe(a);
    expect(planContentSha256(Buffer.from('nothing'), 'c.dcm')).toBeUndefined();
  });
});
