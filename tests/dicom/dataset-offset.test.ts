/** Where a Part-10 file's data set begins: 128 + 4 + the 12-byte group-length element + the group's length (PS3.10 §7.1). */
import { describe, expect, it } from 'vitest';
import { datasetOffset } from '../../src/dicom/dataset-offset.js';
import { explicit, part10, text } from '../helpers/dicom-bytes.js';

const body = explicit(0x0010, 0x0010, 'PN', text('DOE^JANE', 'PN'));

describe('datasetOffset', () => {
  it('is the length of everything before the data set', () => {
    const file = part10('1.2.840.10008.1.2.1', body);
    expect(datasetOffset(file)).toBe(file.length - body.length);
    expect(file.subarray(datasetOffset(file)).equals(body)).toBe(true);
  });
  it('is 0 for a bare data set, a file without the group-length element, or a group length past the end', () => {
    expect(datasetOffset(body)).toBe(0);
    const noLength = part10('1.2.840.10008.1.2.1', body);
    noLength.writeUInt16LE(0x0001, 134); // (0002,0000) turned into (0002,0001)
    expect(datasetOffset(noLength)).toBe(0);
    const tooLong = part10('1.2.840.10008.1.2.1', body);
    tooLong.writeUInt32LE(1e6, 140);
    expect(datasetOffset(tooLong)).toBe(0);
  });
  it('reads a view into a larger buffer from its own start', () => {
    const file = part10('1.2.840.10008.1.2.1', body);
    const padded = Buffer.concat([Buffer.alloc(17), file]);
    expect(datasetOffset(padded.subarray(17))).toBe(file.length - body.length);
  });
});
