/** A file's data set up to its pixel data, read from its first bytes when they hold it, else whole. */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { headScratch, parseHead } from '../../src/dicom/read-head.js';
import { explicit, part10, text } from '../helpers/dicom-bytes.js';

const dir = mkdtempSync(join(tmpdir(), 'plumbline-head-'));
const write = (name: string, bytes: Buffer) => {
  const f = join(dir, name);
  writeFileSync(f, bytes);
  return f;
};
const pixels = (n: number) => explicit(0x7fe0, 0x0010, 'OW', Buffer.alloc(n, 7));
const id = explicit(0x0010, 0x0020, 'LO', text('ID-42'));

describe('parseHead', () => {
  it('a small header before large pixel data: the header read, the pixel element found, the size the file size', () => {
    const f = write('ct.dcm', part10('1.2.840.10008.1.2.1', Buffer.concat([id, pixels(200_000)])));
    const r = parseHead(f);
    if (!r.ok) throw new Error(r.issues[0]!.message);
    expect(r.value.parsed.dataSet.string('x00100020')).toBe('ID-42');
    expect(r.value.parsed.dataSet.elements.x7fe00010).toBeDefined();
    expect(r.value.size).toBe(part10('1.2.840.10008.1.2.1', Buffer.concat([id, pixels(200_000)])).length);
  });
  it('a header longer than the first bytes read (a 100 kB text before the pixels) is read from the whole file', () => {
    const long = explicit(0x0009, 0x1010, 'UT', Buffer.alloc(100_000, 0x41)); // a private text element
    const f = write('long.dcm', part10('1.2.840.10008.1.2.1', Buffer.concat([id, long, pixels(64)])));
    const r = parseHead(f, headScratch());
    if (!r.ok) throw new Error(r.issues[0]!.message);
    expect(r.value.parsed.dataSet.elements.x7fe00010).toBeDefined();
    expect(r.value.parsed.dataSet.elements.x00091010!.length).toBe(100_000);
  });
  it('a file without pixel data is read whole', () => {
    const r = parseHead(write('plan.dcm', part10('1.2.840.10008.1.2.1', id)));
    expect(r.ok && r.value.parsed.dataSet.string('x00100020')).toBe('ID-42');
  });
  it('a missing file is an issue, not a throw; a text file is not DICOM', () => {
    const missing = parseHead(join(dir, 'absent.dcm'));
    expect(!missing.ok && missing.issues[0]).toMatchObject({ code: 'unreadable', message: 'cannot read the file (ENOENT)' });
    const notes = parseHead(write('notes.txt', Buffer.from('not a DICOM file at all, only words')));
    expect(!notes.ok && notes.issues[0]!.code).toBe('not-dicom');
  });
});
