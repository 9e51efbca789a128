/**
 * Nothing half-read passes as a plan: each kind of bad input gives a typed issue naming the file,
 * the beam, the control point and the attribute, with what was expected and what was found.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { importPlanBytes, importPlanFile } from '../../src/dicom/index.js';
import type { Issue } from '../../src/model/index.js';
import { demoPlan } from '../helpers/fixtures.js';
import { writeVariant } from '../helpers/plan-variants.js';

const refused = (file: string): readonly Issue[] => {
  const r = importPlanFile(file);
  if (r.ok) throw new Error(`${file} was accepted`);
  return r.issues;
};
const only = (issues: readonly Issue[]) => {
  expect(issues).toHaveLength(1);
  return issues[0]!;
};

describe('files that are not RT Plans', () => {
  it('a text file is "not a DICOM file"', () => {
    const f = join(mkdtempSync(join(tmpdir(), 'plumbline-bad-')), 'notes.txt');
    writeFileSync(f, 'Patient to be treated on Monday.\n'.repeat(10));
    expect(only(refused(f)).code).toBe('not-dicom');
  });
  it('a missing file is reported, not thrown', () => {
    expect(only(refused('no/such/plan.dcm')).message).toBe('no such file');
  });
  it('an empty file is "not a DICOM file"', () => {
    const r = importPlanBytes(new Uint8Array(0), 'empty.dcm');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(only(r.issues).code).toBe('not-dicom');
  });
});

describe('truncated files and lengths past the end', () => {
  const whole = readFileSync(demoPlan('four-field-box.dcm'));
  it.each([0.3, 0.5, 0.75, 0.95, 0.999])('the four-field plan cut at %s of its length is refused as truncated', (fraction) => {
    const r = importPlanBytes(whole.subarray(0, Math.floor(whole.length * fraction)), 'cut.dcm');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(['truncated', 'length-past-end']).toContain(r.issues[0]!.code);
  });
  it('an element whose declared length runs past the end of the file is named', () => {
    // The explicit-VR length of RTPlanLabel (300A,0002) SH is set to 0xFFF0.
    const bytes = Buffer.from(whole);
    const at = bytes.indexOf(Buffer.from([0x0a, 0x30, 0x02, 0x00, 0x53, 0x48]));
    expect(at).toBeGreaterThan(0);
    bytes.writeUInt16LE(0xfff0, at + 6);
    const r = importPlanBytes(bytes, 'long.dcm');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(['length-past-end', 'truncated']).toContain(r.issues[0]!.code);
  });
});

describe('missing and unreadable attributes', () => {
  it('no nominal energy at control point 0 names beam, control point and attribute', () => {
    const f = writeVariant('four-field-box.dcm', (ds) => delete ds.BeamSequence[1].ControlPointSequence[0].NominalBeamEnergy);
    const i = only(refused(f));
    expect(i).toMatchObject({
      code: 'missing-attribute',
      beamNumber: 2,
      beamName: 'PA',
      controlPointIndex: 0,
      tag: '(300A,0114)',
      path: 'BeamSequence[1].ControlPointSequence[0].NominalBeamEnergy',
    });
    expect(i.expected).toMatch(/energy/);
  });
  it('no Beam Meterset for a treatment beam', () => {
    const f = writeVariant('wedged-pair.dcm', (ds) => delete ds.FractionGroupSequence[0].ReferencedBeamSequence[1].BeamMeterset);
    expect(only(refused(f))).toMatchObject({
      code: 'missing-attribute',
      beamNumber: 2,
      path: 'FractionGroupSequence[0].ReferencedBeamSequence[1].BeamMeterset',
    });
  });
  it('a Beam Meterset that is not a number', () => {
    const f = writeVariant('wedged-pair.dcm', (ds) => (ds.FractionGroupSequence[0].ReferencedBeamSequence[0].BeamMeterset = '18x.3'));
    expect(only(refused(f))).toMatchObject({ code: 'invalid-number', found: '"18x.3"' });
  });
  it('a non-finite Beam Meterset', () => {
    const f = writeVariant('wedged-pair.dcm', (ds) => (ds.FractionGroupSequence[0].ReferencedBeamSequence[0].BeamMeterset = 'NaN'));
    expect(only(refused(f)).code).toBe('invalid-number');
  });
  it('a negative Beam Meterset', () => {
    const f = writeVariant('wedged-pair.dcm', (ds) => (ds.FractionGroupSequence[0].ReferencedBeamSequence[0].BeamMeterset = '-188.3'));
    expect(only(refused(f))).toMatchObject({ code: 'physical-range', beamNumber: 1, found: '-188.3' });
  });
  it('a gantry angle that is not a number, deep in a control point', () => {
    const f = writeVariant('two-arc-vmat.dcm', (ds) => (ds.BeamSequence[0].ControlPointSequence[100].GantryAngle = '1O0.5'));
    expect(refused(f)[0]).toMatchObject({ code: 'invalid-number', beamNumber: 1, controlPointIndex: 100 });
  });
  it('a missing type-2 value (empty isocenter) is a warning, and the plan is read', () => {
    const f = writeVariant('mlc-conformal.dcm', (ds) => (ds.BeamSequence[0].ControlPointSequence[0].IsocenterPosition = ''));
    const r = importPlanFile(f);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.warnings).toEqual([expect.objectContaining({ severity: 'warning', code: 'empty-attribute', tag: '(300A,012C)' })]);
  });
});

describe('values that contradict each other', () => {
  it('a fraction group naming a beam that does not exist', () => {
    const f = writeVariant('four-field-box.dcm', (ds) => (ds.FractionGroupSequence[0].ReferencedBeamSequence[3].ReferencedBeamNumber = '7'));
    expect(only(refused(f))).toMatchObject({ code: 'unknown-reference', beamNumber: 7, found: '7', expected: '1, 2, 3, 4' });
  });
  it('cumulative meterset weights that go backwards', () => {
    const f = writeVariant('two-arc-vmat.dcm', (ds) => (ds.BeamSequence[1].ControlPointSequence[50].CumulativeMetersetWeight = '0.01'));
    expect(only(refused(f))).toMatchObject({ code: 'meterset-weight-decreasing', beamNumber: 2, controlPointIndex: 50 });
  });
  it('crossed jaws', () => {
    const f = writeVariant(
      'four-field-box.dcm',
      (ds) => (ds.BeamSequence[2].ControlPointSequence[0].BeamLimitingDevicePositionSequence[1].LeafJawPositions = ['60', '-60']),
    );
    expect(only(refused(f))).toMatchObject({ code: 'jaws-crossed', beamNumber: 3, controlPointIndex: 0 });
  });
  it('crossed leaves', () => {
    const f = writeVariant('mlc-conformal.dcm', (ds) => {
      const leaves = ds.BeamSequence[0].ControlPointSequence[0].BeamLimitingDevicePositionSequence[2].LeafJawPositions;
      leaves[30] = '20'; // bank 1 of pair 31 beyond its bank 2 (44.9)
      leaves[90] = '10';
    });
    expect(only(refused(f))).toMatchObject({ code: 'leaves-crossed', found: '20 > 10' });
  });
  it('the wrong number of leaf positions', () => {
    const f = writeVariant('mlc-conformal.dcm', (ds) =>
      ds.BeamSequence[0].ControlPointSequence[0].BeamLimitingDevicePositionSequence[2].LeafJawPositions.pop(),
    );
    expect(only(refused(f))).toMatchObject({ code: 'wrong-multiplicity', expected: '120 values', found: '119' });
  });
  it('a final cumulative meterset weight that the last control point does not reach', () => {
    const f = writeVariant('wedged-pair.dcm', (ds) => (ds.BeamSequence[0].FinalCumulativeMetersetWeight = '2'));
    expect(only(refused(f))).toMatchObject({ code: 'inconsistent', beamNumber: 1 });
  });
  it('a wedge position naming a wedge the beam does not have', () => {
    const f = writeVariant(
      'wedged-pair.dcm',
      (ds) => (ds.BeamSequence[1].ControlPointSequence[0].WedgePositionSequence[0].ReferencedWedgeNumber = '3'),
    );
    expect(only(refused(f))).toMatchObject({ code: 'unknown-reference', beamNumber: 2, controlPointIndex: 0 });
  });
  it('an unknown patient position', () => {
    const f = writeVariant('four-field-box.dcm', (ds) => (ds.PatientSetupSequence[0].PatientPosition = 'HFX'));
    expect(only(refused(f))).toMatchObject({ code: 'invalid-value', found: '"HFX"' });
  });
});

describe('patient positions', () => {
  it.each(['HFS', 'HFP', 'FFS', 'FFP', 'HFDR', 'HFDL', 'FFDR', 'FFDL'])('%s is recognised', (position) => {
    const f = writeVariant('four-field-box.dcm', (ds) => (ds.PatientSetupSequence[0].PatientPosition = position));
    const r = importPlanFile(f);
    expect(r.ok && r.value.plan.patientSetups[0]!.position).toBe(position);
  });
});
