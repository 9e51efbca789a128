/**
 * A run's files checked in file order: a batch of 200 or more without CT or RT Dose is shared among
 * worker threads, and gives exactly what one thread gives; each file is told once as it is done;
 * refusals and skipped files are gathered apart.
 */
import { copyFileSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { type CheckRequest, loadCheckInputs } from '../../src/run/check-inputs.js';
import { checkFiles } from '../../src/run/check-files.js';
import { collectFiles } from '../../src/run/collect-files.js';
import { manifestPath } from '../helpers/machines.js';

const SOURCES = ['brain-laterals.dcm', 'lung-mlc.dcm', 'prostate-vmat.dcm'].map((f) => manifestPath(`fixtures/demo/clinic/${f}`));
const request: CheckRequest = { beamData: 'demo', machineAlias: [], suggestPoint: false, heterogeneity: 'tpr-ratio' };
const inputs = (() => {
  const r = loadCheckInputs(request);
  if (!r.ok) throw new Error(r.issues[0]!.message);
  return r.value;
})();

describe('checkFiles', () => {
  it('200 plans in two worker threads: the results of one thread, in file order, each file told once', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-files-'));
    for (let i = 0; i < 200; i++) copyFileSync(SOURCES[i % 3]!, join(dir, `p${String(i).padStart(3, '0')}.dcm`));
    const files = collectFiles([dir]);
    let told = 0;
    const pooled = await checkFiles(files, inputs, { ...request, threads: 2 }, () => told++);
    expect(told).toBe(200);
    const alone = await checkFiles(files, inputs, { ...request, threads: 1 }, () => {});
    expect(pooled.plans.map((p) => p.file)).toEqual(files.map((f) => f.path));
    expect(JSON.stringify(pooled.plans)).toBe(JSON.stringify(alone.plans));
  }, 120_000);
  it('a refused file and a skipped one are gathered apart from the plans', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-files-'));
    copyFileSync(SOURCES[0]!, join(dir, 'a.dcm'));
    writeFileSync(join(dir, 'b.dcm'), 'not DICOM at all, though named so');
    writeFileSync(join(dir, 'c.txt'), 'notes');
    const r = await checkFiles(collectFiles([dir]), inputs, request, () => {});
    expect(r.plans).toHaveLength(1);
    expect(r.refused.map((i) => i.code)).toEqual(['not-dicom']);
    expect(r.skipped).toEqual([{ file: join(dir, 'c.txt'), reason: 'not a DICOM file' }]);
  });
});
