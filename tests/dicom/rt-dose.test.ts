/**
 * An RT Dose written byte by byte (PS3.3 RT Dose module: Dose Grid Scaling, Grid Frame Offset
 * Vector; PS3.5 encodings): the grid in Gy, its geometry, what it references, and the refusals.
 * pydicom's own rtdose.dcm is read in tests/reference/rtdose.test.ts.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readRtDose } from '../../src/dicom/rt-dose.js';
import { explicit, part10, sequence, text, uint16 } from '../helpers/dicom-bytes.js';

const RT_DOSE = '1.2.840.10008.5.1.4.1.1.481.2';
const dir = mkdtempSync(join(tmpdir(), 'plumbline-rtdose-'));

interface Spec {
  readonly bits?: 16 | 32;
  readonly signed?: boolean;
  readonly offsets?: string;
  readonly ipp?: string;
  readonly pixels?: Buffer;
  readonly omit?: number;
}
/** 3 columns × 2 rows × 2 frames; raw value of voxel (i, j, k) = 100·k + 10·j + i (+1), scaled by 0.001 Gy. */
function write(name: string, s: Spec = {}): string {
  const bits = s.bits ?? 32;
  const raw = [0, 1].flatMap((k) => [0, 1].flatMap((j) => [0, 1, 2].map((i) => 100 * k + 10 * j + i + 1)));
  const pixels = Buffer.alloc((raw.length * bits) / 8);
  raw.forEach((v, n) => (bits === 32 ? pixels.writeUInt32LE(v, 4 * n) : s.signed ? pixels.writeInt16LE(-v, 2 * n) : pixels.writeUInt16LE(v, 2 * n)));
  const elements: [number, Buffer][] = [
    [0x00080016, explicit(0x0008, 0x0016, 'UI', text(RT_DOSE, 'UI'))],
    [0x00200032, explicit(0x0020, 0x0032, 'DS', text(s.ipp ?? '-10\\-20\\30'))],
    [0x00200037, explicit(0x0020, 0x0037, 'DS', text('1\\0\\0\\0\\1\\0'))],
    [0x00200052, explicit(0x0020, 0x0052, 'UI', text('1.2.3.9', 'UI'))],
    [0x00280008, explicit(0x0028, 0x0008, 'IS', text('2'))],
    [0x00280010, explicit(0x0028, 0x0010, 'US', uint16(2))],
    [0x00280011, explicit(0x0028, 0x0011, 'US', uint16(3))],
    [0x00280030, explicit(0x0028, 0x0030, 'DS', text('2.5\\4'))],
    [0x00280100, explicit(0x0028, 0x0100, 'US', uint16(bits))],
    [0x00280103, explicit(0x0028, 0x0103, 'US', uint16(s.signed ? 1 : 0))],
    [0x30040002, explicit(0x3004, 0x0002, 'CS', text('GY'))],
    [0x30040004, explicit(0x3004, 0x0004, 'CS', text('PHYSICAL'))],
    [0x3004000a, explicit(0x3004, 0x000a, 'CS', text('BEAM'))],
    [0x3004000c, explicit(0x3004, 0x000c, 'DS', text(s.offsets ?? '0\\5'))],
    [0x3004000e, explicit(0x3004, 0x000e, 'DS', text('0.001'))],
    [0x30040014, explicit(0x3004, 0x0014, 'CS', text('IMAGE\\ROI_OVERRIDE'))],
    [
      0x300c0002,
      sequence(0x300c, 0x0002, [
        Buffer.concat([
          explicit(0x0008, 0x1150, 'UI', text('1.2.840.10008.5.1.4.1.1.481.5', 'UI')),
          explicit(0x0008, 0x1155, 'UI', text('1.2.3.7', 'UI')),
          sequence(0x300c, 0x0020, [sequence(0x300c, 0x0004, [explicit(0x300c, 0x0006, 'IS', text('2'))])]),
        ]),
      ]),
    ],
    [0x7fe00010, explicit(0x7fe0, 0x0010, 'OW', s.pixels ?? pixels)],
  ];
  const f = join(dir, `${name}.dcm`);
  writeFileSync(f, part10('1.2.840.10008.1.2.1', Buffer.concat(elements.filter(([t]) => t !== s.omit).map(([, b]) => b)), RT_DOSE));
  return f;
}
const read = (f: string) => {
  const r = readRtDose(f);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.value;
};

describe('readRtDose', () => {
  it('gives the dose in Gy (raw × Dose Grid Scaling), x fastest, then y, then frame', () => {
    const g = read(write('u32'));
    expect(Array.from(g.doseGy, (v) => Math.round(v * 1e6) / 1e3)).toEqual([1, 2, 3, 11, 12, 13, 101, 102, 103, 111, 112, 113]);
  });
  it('reads 16-bit signed grids', () => {
    expect(read(write('s16', { bits: 16, signed: true })).doseGy[4]).toBeCloseTo(-0.012, 6);
  });
  it('its geometry: Pixel Spacing lists the row spacing first (PS3.3 C.7.6.2.1.1); the normal is row × column direction', () => {
    const g = read(write('geo'));
    expect([g.columns, g.rows, g.rowSpacingMm, g.columnSpacingMm]).toEqual([3, 2, 2.5, 4]);
    expect(g.normal).toEqual([0, 0, 1]);
    expect(g.originMm).toEqual([-10, -20, 30]);
  });
  it('frame offsets starting at 0 are relative to the first frame; otherwise positions along the normal', () => {
    expect(read(write('rel')).frameOffsetsMm).toEqual([0, 5]);
    expect(read(write('abs', { offsets: '30\\35' })).frameOffsetsMm).toEqual([0, 5]);
  });
  it('what it references: the plan, the beam, the heterogeneity correction, units and summation', () => {
    expect(read(write('refs'))).toMatchObject({
      referencedPlanUid: '1.2.3.7',
      referencedBeamNumber: 2,
      tissueHeterogeneityCorrection: ['IMAGE', 'ROI_OVERRIDE'],
      units: 'GY',
      type: 'PHYSICAL',
      summationType: 'BEAM',
      frameOfReferenceUid: '1.2.3.9',
    });
  });
});

describe('refusals', () => {
  const issues = (f: string) => {
    const r = readRtDose(f);
    if (r.ok) throw new Error('accepted');
    return r.issues;
  };
  it('a missing Dose Grid Scaling is named; no dose comes back', () => {
    expect(issues(write('noscale', { omit: 0x3004000e }))[0]).toMatchObject({ code: 'missing-attribute', path: 'DoseGridScaling' });
  });
  it('fewer frame offsets than frames', () => {
    expect(issues(write('offsets', { offsets: '0' }))[0]).toMatchObject({ code: 'wrong-multiplicity', path: 'GridFrameOffsetVector' });
  });
  it('pixel data shorter than the grid', () => {
    expect(issues(write('short', { pixels: Buffer.alloc(40) }))[0]).toMatchObject({ code: 'inconsistent', expected: '48 bytes', found: '40' });
  });
  it('no pixel data', () => {
    expect(issues(write('nopixels', { omit: 0x7fe00010 }))[0]).toMatchObject({ code: 'missing-attribute', path: 'PixelData' });
  });
});
