/** A file read as an object of one SOP class; anything else is an issue naming the file and the class found. */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { readDicomObject } from '../../src/dicom/read-object.js';
import { explicit, part10, text } from '../helpers/dicom-bytes.js';

const RT_DOSE = '1.2.840.10008.5.1.4.1.1.481.2';
const CT = '1.2.840.10008.5.1.4.1.1.2';
const dir = mkdtempSync(join(tmpdir(), 'plumbline-object-'));
const file = (sopClass: string) => {
  const f = join(dir, `${sopClass}.dcm`);
  writeFileSync(
    f,
    part10(
      '1.2.840.10008.1.2.1',
      Buffer.concat([explicit(0x0008, 0x0016, 'UI', text(sopClass, 'UI')), explicit(0x0010, 0x0020, 'LO', text('ID-7'))]),
      sopClass,
    ),
  );
  return f;
};

describe('readDicomObject', () => {
  it('gives a reader of the object when its class is the one expected', () => {
    const r = readDicomObject(file(RT_DOSE), RT_DOSE, 'RT Dose');
    if (!r.ok) throw new Error(r.issues[0]!.message);
    expect(r.value.reader.string('PatientID')).toBe('ID-7');
    expect(r.value.transferSyntaxUid).toBe('1.2.840.10008.1.2.1');
    expect(r.value.issues).toEqual([]);
  });
  it('refuses another class, saying what was expected and found', () => {
    const r = readDicomObject(file(CT), RT_DOSE, 'RT Dose');
    expect(!r.ok && r.issues[0]).toMatchObject({
      code: 'invalid-value',
      path: 'SOPClassUID',
      message: 'not an RT Dose',
      expected: RT_DOSE,
      found: CT,
    });
  });
  it('a missing file is unreadable', () => {
    const r = readDicomObject(join(dir, 'none.dcm'), RT_DOSE, 'RT Dose');
    expect(!r.ok && r.issues[0]!.code).toBe('unreadable');
  });
});
