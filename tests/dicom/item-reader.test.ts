/**
 * Reading attributes by keyword, decoded by their VR as PS3.5 defines them (DS/IS text, US binary,
 * multi-valued text split at backslashes, padding trimmed), from elements written byte by byte; what
 * cannot be read faithfully is an issue naming the attribute, its tag and its path, never a guess.
 */
import type { DataSet } from 'dicom-parser';
import { describe, expect, it } from 'vitest';
import { ItemReader, need, oneOf } from '../../src/dicom/item-reader.js';
import { parseDicomBytes } from '../../src/dicom/parse-bytes.js';
import type { Issue } from '../../src/model/index.js';
import { explicit, implicit, sequence, text, uint16 } from '../helpers/dicom-bytes.js';

const dataSet = (bytes: Buffer): DataSet => {
  const r = parseDicomBytes(bytes, 'plan.dcm');
  if (!r.ok) throw new Error(r.issues[0]!.message);
  return r.value.dataSet;
};
const reader = (...elements: Buffer[]) => {
  const issues: Issue[] = [];
  const all = Buffer.concat([explicit(0x0008, 0x0016, 'UI', text('1.2.840.10008.5.1.4.1.1.481.5', 'UI')), ...elements]);
  return { r: new ItemReader(dataSet(all), { file: 'plan.dcm', path: '' }, issues, 'latin1'), issues };
};

describe('text values', () => {
  it('multi-valued text splits at backslashes, each value trimmed of its padding', () => {
    const { r } = reader(explicit(0x0008, 0x0005, 'CS', text('\\ISO 2022 IR 100 ')));
    expect(r.strings('SpecificCharacterSet')).toEqual(['', 'ISO 2022 IR 100']);
    expect(r.string('SpecificCharacterSet')).toBe('');
  });
  it('ST keeps its backslashes and leading spaces', () => {
    const { r } = reader(explicit(0x300a, 0x0004, 'ST', text('  a\\b ')));
    expect(r.string('RTPlanDescription')).toBe('  a\\b');
  });
  it('a control character inside a label is shown as U+FFFD, never passed on', () => {
    const { r } = reader(explicit(0x300a, 0x0002, 'SH', text('PLAN\x1b[2J')));
    expect(r.string('RTPlanLabel')).toBe('PLAN\ufffd[2J');
  });
  it('a value of padding only is empty: absent to string(), "empty" to need()', () => {
    const { r, issues } = reader(explicit(0x300a, 0x0002, 'SH', text('    ')));
    expect(r.string('RTPlanLabel')).toBeUndefined();
    expect(r.isEmpty('RTPlanLabel')).toBe(true);
    need(r, 'RTPlanLabel', r.string('RTPlanLabel'), 'a label');
    expect(issues[0]).toMatchObject({ code: 'empty-attribute', path: 'RTPlanLabel', tag: '(300A,0002)' });
  });
  it('a missing attribute is "missing", once however often it is asked for', () => {
    const { r, issues } = reader();
    need(r, 'RTPlanLabel', r.string('RTPlanLabel'), 'a label');
    need(r, 'RTPlanLabel', r.string('RTPlanLabel'), 'a label');
    expect(issues).toEqual([expect.objectContaining({ code: 'missing-attribute', expected: 'a label' })]);
  });
  it('oneOf keeps a defined term and reports any other', () => {
    const { r, issues } = reader(explicit(0x300a, 0x00c6, 'CS', text('PHOTON')), explicit(0x300a, 0x00ce, 'CS', text('TREATMNT')));
    expect(oneOf(r, 'RadiationType', ['PHOTON', 'ELECTRON'])).toBe('PHOTON');
    expect(oneOf(r, 'TreatmentDeliveryType', ['TREATMENT', 'SETUP'])).toBeUndefined();
    expect(issues[0]).toMatchObject({ code: 'invalid-value', found: '"TREATMNT"', expected: 'TREATMENT, SETUP' });
  });
});

describe('numbers', () => {
  it('decimal and integer strings, one value or a tuple', () => {
    const { r } = reader(
      explicit(0x300a, 0x0086, 'DS', text('123.45 ')),
      explicit(0x300a, 0x00c0, 'IS', text('3 ')),
      explicit(0x300a, 0x012c, 'DS', text('1.5\\-2e1\\0')),
    );
    expect(r.number('BeamMeterset')).toBe(123.45);
    expect(r.integer('BeamNumber')).toBe(3);
    expect(r.tuple('IsocenterPosition', 3)).toEqual([1.5, -20, 0]);
  });
  it('binary US values in implicit VR take their VR from the dictionary', () => {
    const issues: Issue[] = [];
    const ds = dataSet(Buffer.concat([implicit(0x0008, 0x0016, text('1.2.840.10008.5.1.4.1.1.2', 'UI')), implicit(0x0028, 0x0010, uint16(512))]));
    expect(new ItemReader(ds, { file: 'ct.dcm', path: '' }, issues, 'latin1').number('Rows')).toBe(512);
    expect(issues).toEqual([]);
  });
  it('an unreadable decimal string names the value and what was expected', () => {
    const { r, issues } = reader(explicit(0x300a, 0x012c, 'DS', text('1.5\\abc\\0')));
    expect(r.tuple('IsocenterPosition', 3)).toBeUndefined();
    expect(issues[0]).toMatchObject({ code: 'invalid-number', message: 'value 2 of 3 cannot be read as a number', found: '"abc"' });
  });
  it('the wrong number of values is a multiplicity issue', () => {
    const { r, issues } = reader(explicit(0x300a, 0x012c, 'DS', text('1.5\\2')));
    expect(r.tuple('IsocenterPosition', 3)).toBeUndefined();
    expect(issues[0]).toMatchObject({ code: 'wrong-multiplicity', expected: '3 values', found: '2' });
  });
  it('a value no treatment can hold is refused (a gantry angle of 360, outside [0, 360))', () => {
    const { r, issues } = reader(explicit(0x300a, 0x011e, 'DS', text('360')));
    expect(r.number('GantryAngle')).toBeUndefined();
    expect(issues[0]!.code).toBe('physical-range');
  });
  it('a non-integer integer is refused', () => {
    const { r, issues } = reader(explicit(0x300a, 0x0086, 'DS', text('2.5')));
    expect(r.integer('BeamMeterset')).toBeUndefined();
    expect(issues[0]!.code).toBe('invalid-number');
  });
});

describe('sequences', () => {
  it('items carry their path and the scope given by within()', () => {
    const beams = sequence(0x300a, 0x00b0, [explicit(0x300a, 0x00c0, 'IS', text('1')), explicit(0x300a, 0x00c0, 'IS', text('x'))]);
    const { r, issues } = reader(beams);
    const items = r.sequence('BeamSequence');
    expect(items.map((i) => i.scope.path)).toEqual(['BeamSequence[0]', 'BeamSequence[1]']);
    expect(items[0]!.integer('BeamNumber')).toBe(1);
    items[1]!.within({ beamNumber: 2, beamName: 'PA' }).integer('BeamNumber');
    expect(issues[0]).toMatchObject({ path: 'BeamSequence[1].BeamNumber', beamNumber: 2, beamName: 'PA' });
  });
  it('an absent sequence has no items; a text element read as a sequence is an issue', () => {
    const { r, issues } = reader(explicit(0x300a, 0x00b0, 'LO', text('not items')));
    expect(r.sequence('ControlPointSequence')).toEqual([]);
    expect(r.sequence('BeamSequence')).toEqual([]);
    expect(issues[0]).toMatchObject({ code: 'invalid-value', message: 'is not a sequence' });
  });
});
