/**
 * An RT Structure Set written byte by byte (PS3.3 Structure Set, ROI Contour and RT ROI
 * Observations modules): ROIs joined to their contours and interpreted types by ROI number.
 * pydicom's rtstruct.dcm is read in tests/reference/rtstruct.test.ts.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readRtStruct } from '../../src/dicom/rt-struct.js';
import { explicit, part10, sequence, text } from '../helpers/dicom-bytes.js';

const RT_STRUCT = '1.2.840.10008.5.1.4.1.1.481.3';
const dir = mkdtempSync(join(tmpdir(), 'plumbline-rtstruct-'));
const is = (element: number, v: string) => explicit(0x3006, element, 'IS', text(v));
const contour = (points: string, n: string) =>
  Buffer.concat([explicit(0x3006, 0x0042, 'CS', text('CLOSED_PLANAR')), is(0x0046, n), explicit(0x3006, 0x0050, 'DS', text(points))]);

function write(name: string, points = '0\\0\\0\\10\\0\\0\\10\\10\\0', count = '3'): string {
  const body = Buffer.concat([
    explicit(0x0008, 0x0016, 'UI', text(RT_STRUCT, 'UI')),
    explicit(0x0008, 0x0018, 'UI', text('1.2.3.55', 'UI')),
    explicit(0x3006, 0x0002, 'SH', text('PELVIS')),
    sequence(0x3006, 0x0020, [
      Buffer.concat([is(0x0022, '1'), explicit(0x3006, 0x0024, 'UI', text('1.2.3.9', 'UI')), explicit(0x3006, 0x0026, 'LO', text('BODY'))]),
      Buffer.concat([is(0x0022, '2'), explicit(0x3006, 0x0026, 'LO', text('PTV'))]),
    ]),
    // ROI Contour Sequence lists ROI 2 before ROI 1: joined by number, not by order.
    sequence(0x3006, 0x0039, [
      Buffer.concat([sequence(0x3006, 0x0040, [contour('1\\1\\0\\2\\1\\0\\2\\2\\0', '3')]), is(0x0084, '2')]),
      Buffer.concat([sequence(0x3006, 0x0040, [contour(points, count)]), is(0x0084, '1')]),
    ]),
    sequence(0x3006, 0x0080, [Buffer.concat([is(0x0084, '1'), explicit(0x3006, 0x00a4, 'CS', text('EXTERNAL'))])]),
  ]);
  const f = join(dir, `${name}.dcm`);
  writeFileSync(f, part10('1.2.840.10008.1.2.1', body, RT_STRUCT));
  return f;
}

describe('readRtStruct', () => {
  it('each ROI with its name, type, frame of reference and contour points, joined by ROI number', () => {
    const r = readRtStruct(write('ok'));
    if (!r.ok) throw new Error(r.issues[0]!.message);
    expect(r.value).toMatchObject({ sopInstanceUid: '1.2.3.55', label: 'PELVIS' });
    const [body, ptv] = r.value.structures;
    expect(body).toEqual({
      number: 1,
      name: 'BODY',
      type: 'EXTERNAL',
      frameOfReferenceUid: '1.2.3.9',
      contours: [
        {
          geometricType: 'CLOSED_PLANAR',
          pointsMm: [
            [0, 0, 0],
            [10, 0, 0],
            [10, 10, 0],
          ],
        },
      ],
    });
    expect(ptv!.type).toBeUndefined();
    expect(ptv!.contours[0]!.pointsMm[2]).toEqual([2, 2, 0]);
  });
  it('refuses contour data whose count disagrees with Number of Contour Points, naming the path', () => {
    const r = readRtStruct(write('bad', '0\\0\\0\\10\\0\\0', '3'));
    expect(!r.ok && r.issues[0]).toMatchObject({
      code: 'wrong-multiplicity',
      path: 'ROIContourSequence[1].ContourSequence[0].ContourData',
      expected: '9 values',
      found: '6',
    });
  });
});
