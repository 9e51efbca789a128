/** The hash of a data set as sent: the bytes after the file meta group, as dcmtk's dcmconv writes them alone (-F: no meta; -e: lengths as read). */
import { createHash } from 'node:crypto';
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { datasetOffset } from '../../src/dicom/index.js';
import { datasetSha256 } from '../../src/run/dataset-hash.js';
import { manifestPath } from '../helpers/machines.js';

const sha = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

describe('the data set as sent', () => {
  it.each(['fixtures/demo/clinic/brain-laterals.dcm', 'fixtures/demo/clinic/prostate-vmat.dcm'])(
    '%s: the same bytes as dcmconv -F -e writes, so the same hash',
    (f) => {
      const out = join(mkdtempSync(join(tmpdir(), 'plumbline-ds-')), 'ds.bin');
      const r = spawnSync('dcmconv', ['-F', '-e', manifestPath(f), out], { encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(0);
      const bytes = readFileSync(manifestPath(f));
      expect(datasetSha256(bytes)).toBe(sha(readFileSync(out)));
      expect(datasetSha256(bytes)).not.toBe(sha(bytes));
    },
  );
  it('bytes that are no Part-10 file are hashed whole', () => {
    const bytes = new Uint8Array([1, 2, 3, 4]);
    expect(datasetOffset(bytes)).toBe(0);
    expect(datasetSha256(bytes)).toBe(sha(bytes));
  });
});
