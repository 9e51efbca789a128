/**
 * A CT series re-encoded by dcmtk's dcmconv (implicit VR, big endian, deflated) reads to the same HU,
 * voxel for voxel, as the series written (scripts/fixtures/ct-phantom.ts).
 */
import { mkdirSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeCtPhantom } from '../../scripts/fixtures/ct-phantom.js';
import { readCtSeries } from '../../src/dicom/index.js';

const work = mkdtempSync(join(tmpdir(), 'plumbline-ct-reencoded-'));

describe('a CT series re-encoded by dcmtk dcmconv', () => {
  it.each([
    ['implicit VR little endian', ['+ti']],
    ['explicit VR big endian', ['+tb']],
    ['deflated explicit VR little endian', ['+td']],
  ])('%s gives the same HU voxel for voxel', async (_name, args) => {
    const { spawnSync } = await import('node:child_process');
    const dir = join(work, `reencoded-${args[0]!.slice(1)}`);
    mkdirSync(dir);
    const src = join(work, 'small');
    mkdirSync(src, { recursive: true });
    const files = writeCtPhantom(src, {
      name: `small${args[0]}`,
      columns: 16,
      rows: 12,
      slices: 5,
      spacingMm: [2, 3, 4],
      originMm: [0, 0, 0],
      frameOfReferenceUid: '1.2.3',
      hu: (x, y, z) => Math.round(x * 7 - y * 3 + z * 11 - 500),
    });
    const original = readCtSeries(files);
    const converted = files.map((f, i) => {
      const out = join(dir, `${i}.dcm`);
      const r = spawnSync('dcmconv', [...args, f, out], { encoding: 'utf8' });
      if (r.status !== 0) throw new Error(r.stderr);
      return out;
    });
    const again = readCtSeries(converted);
    expect(original.ok && again.ok).toBe(true);
    if (original.ok && again.ok) expect(Array.from(again.value.hu)).toEqual(Array.from(original.value.hu));
  });
});
