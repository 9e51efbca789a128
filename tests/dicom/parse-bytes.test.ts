/**
 * The layouts a DICOM file comes in (PS3.10 §7.1 Part-10 file; a bare data set in implicit or
 * explicit VR little endian, PS3.5 §7.1), written byte by byte in the test, and the refusals.
 */
import zlib from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { parseDicomBytes } from '../../src/dicom/parse-bytes.js';
import { explicit, implicit, part10, text } from '../helpers/dicom-bytes.js';

const RT_PLAN = '1.2.840.10008.5.1.4.1.1.481.5';
/** SOP Class UID, then Patient's Name: the first elements of a plan's data set. */
const explicitBody = Buffer.concat([explicit(0x0008, 0x0016, 'UI', text(RT_PLAN, 'UI')), explicit(0x0010, 0x0010, 'PN', text('DOE^JANE', 'PN'))]);
const implicitBody = Buffer.concat([implicit(0x0008, 0x0016, text(RT_PLAN, 'UI')), implicit(0x0010, 0x0010, text('DOE^JANE', 'PN'))]);
const ok = (r: ReturnType<typeof parseDicomBytes>) => {
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.value;
};

describe('layouts', () => {
  it('a Part-10 file in Explicit VR Little Endian', () => {
    const v = ok(parseDicomBytes(part10('1.2.840.10008.1.2.1', explicitBody), 'a.dcm'));
    expect(v).toMatchObject({ transferSyntaxUid: '1.2.840.10008.1.2.1', hasPart10Header: true });
    expect(v.dataSet.string('x00100010')).toBe('DOE^JANE');
  });
  it('a Part-10 file in Implicit VR Little Endian', () => {
    const v = ok(parseDicomBytes(part10('1.2.840.10008.1.2', implicitBody), 'a.dcm'));
    expect(v.transferSyntaxUid).toBe('1.2.840.10008.1.2');
    expect(v.dataSet.string('x00080016')).toBe(RT_PLAN);
  });
  it('a meta group without the preamble is read as a file', () => {
    const v = ok(parseDicomBytes(part10('1.2.840.10008.1.2.1', explicitBody).subarray(132), 'a.dcm'));
    expect(v.dataSet.string('x00100010')).toBe('DOE^JANE');
  });
  it('a bare data set, told implicit or explicit by its first element', () => {
    expect(ok(parseDicomBytes(implicitBody, 'b.dcm'))).toMatchObject({ transferSyntaxUid: '1.2.840.10008.1.2', hasPart10Header: false });
    expect(ok(parseDicomBytes(explicitBody, 'b.dcm'))).toMatchObject({ transferSyntaxUid: '1.2.840.10008.1.2.1', hasPart10Header: false });
    expect(ok(parseDicomBytes(implicitBody, 'b.dcm')).dataSet.string('x00100010')).toBe('DOE^JANE');
  });
  it('a deflated data set (raw deflate after the meta group, PS3.5 §A.5) is inflated', () => {
    const file = part10('1.2.840.10008.1.2.1.99', zlib.deflateRawSync(explicitBody));
    expect(ok(parseDicomBytes(file, 'd.dcm')).dataSet.string('x00100010')).toBe('DOE^JANE');
  });
  it('reading stops at the tag asked for', () => {
    const body = Buffer.concat([explicitBody, explicit(0x7fe0, 0x0010, 'OW', Buffer.alloc(8)), explicit(0x7fe1, 0x0010, 'LO', text('after'))]);
    const v = ok(parseDicomBytes(part10('1.2.840.10008.1.2.1', body), 'p.dcm', { untilTag: 'x7fe00010' }));
    expect(v.dataSet.elements.x7fe10010).toBeUndefined();
    expect(v.dataSet.string('x00100010')).toBe('DOE^JANE');
  });
});

describe('refusals, each an issue naming the file', () => {
  const issue = (r: ReturnType<typeof parseDicomBytes>) => {
    if (r.ok) throw new Error('accepted');
    expect(r.issues).toHaveLength(1);
    return r.issues[0]!;
  };
  it('text is not DICOM, and the first bytes are shown', () => {
    const i = issue(parseDicomBytes(Buffer.from('Patient to be treated on Monday.'), 'notes.txt'));
    expect(i).toMatchObject({ code: 'not-dicom', file: 'notes.txt' });
    expect(i.found).toMatch(/^32 bytes starting 50 61 74/);
  });
  it('a compressed transfer syntax is unsupported, the supported ones listed', () => {
    const i = issue(parseDicomBytes(part10('1.2.840.10008.1.2.4.50', explicitBody), 'j.dcm'));
    expect(i).toMatchObject({ code: 'unsupported-transfer-syntax', path: 'TransferSyntaxUID', found: '1.2.840.10008.1.2.4.50' });
    expect(i.expected).toContain('1.2.840.10008.1.2.1');
  });
  it('a deflated data set inflating beyond the limit is refused as too large', () => {
    const big = Buffer.concat([explicitBody, explicit(0x0010, 0x4000, 'LT', Buffer.alloc(10_000, 0x20))]);
    const i = issue(parseDicomBytes(part10('1.2.840.10008.1.2.1.99', zlib.deflateRawSync(big)), 'd.dcm', { maxInflatedBytes: 4096 }));
    expect(i.code).toBe('too-large');
  });
  it('an element whose length runs past the end is named with its tag and keyword', () => {
    const cut = Buffer.concat([explicitBody, explicit(0x300a, 0x0002, 'SH', text('PLAN'))]);
    cut.writeUInt16LE(0x00f0, cut.length - 6); // RTPlanLabel declares 240 bytes
    const i = issue(parseDicomBytes(part10('1.2.840.10008.1.2.1', cut), 'cut.dcm'));
    expect(i.code).toBe('length-past-end');
    expect(i.message).toMatch(/\(300A,0002\) RTPlanLabel declares 240 bytes/);
    expect(i.path).toBe('RTPlanLabel');
  });
});
