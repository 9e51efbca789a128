import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { Manifest } from '../../src/beamdata/index.js';
import { BJR25_MANIFEST, DEMO_MANIFEST, KHAN_MANIFEST } from '../helpers/machines.js';

describe('beam-data manifest schema', () => {
  it.each([DEMO_MANIFEST, BJR25_MANIFEST, KHAN_MANIFEST])('accepts %s', (file) => {
    expect(Manifest.safeParse(JSON.parse(readFileSync(file, 'utf8'))).success).toBe(true);
  });
  it('refuses both PDD and TPR derived, both or neither of Sp and Scp, and unknown keys', () => {
    const demo = JSON.parse(readFileSync(DEMO_MANIFEST, 'utf8'));
    const b = demo.beams[0];
    const variant = (change: object) => Manifest.safeParse({ ...demo, beams: [{ ...b, ...change }] }).success;
    expect(variant({ pdd: 'derive-from-tpr', tpr: 'derive-from-pdd' })).toBe(false);
    expect(variant({ scp: b.sp })).toBe(false);
    expect(variant({ sp: undefined })).toBe(false);
    expect(variant({ energyMV: 6 })).toBe(false);
    expect(variant({})).toBe(true);
  });
  it('takes a dosimetric leaf gap from 0 to 5 mm (common practice, no source: commissioned values are a few tenths of a mm to about 2.5 mm)', () => {
    const demo = JSON.parse(readFileSync(DEMO_MANIFEST, 'utf8'));
    const variant = (gap: unknown) => Manifest.safeParse({ ...demo, beams: [{ ...demo.beams[0], dosimetricLeafGapMm: gap }] }).success;
    expect([0, 1.5, 5].map(variant)).toEqual([true, true, true]);
    expect([-0.1, 5.1, 15, '1.5'].map(variant)).toEqual([false, false, false, false]);
  });
});
