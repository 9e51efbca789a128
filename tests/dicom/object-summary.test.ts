/**
 * What intake learns of a file before checking anything: its kind and the UIDs that group it, each
 * compared with dcmtk's dcmdump reading of the same file.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeCtPhantom } from '../../scripts/fixtures/ct-phantom.js';
import { writeRtDose } from '../../scripts/fixtures/rt-dose.js';
import { writeRtStruct } from '../../scripts/fixtures/rt-struct.js';
import { readObjectSummary } from '../../src/dicom/object-summary.js';
import { demoPlan } from '../helpers/fixtures.js';
import { dcmdumpTree, type RefNode } from '../helpers/reference-tree.js';
import { explicit, part10, text } from '../helpers/dicom-bytes.js';

const dir = mkdtempSync(join(tmpdir(), 'plumbline-summary-'));
const FRAME = '1.2.826.0.1.3680043.10.1171.99.1';
const value = (node: RefNode, kw: string) => {
  const v = node.get(kw);
  return v && 'values' in v ? v.values[0] : undefined;
};
const items = (node: RefNode, kw: string) => {
  const v = node.get(kw);
  return v && 'items' in v ? v.items : [];
};
const expectSummaryAsDcmdump = (file: string, kind: string) => {
  const r = readObjectSummary(file);
  if (!r.ok) throw new Error(r.issues[0]!.message);
  const ref = dcmdumpTree(file);
  expect(r.value).toMatchObject({ kind, sopClassUid: value(ref, 'SOPClassUID'), sopInstanceUid: value(ref, 'SOPInstanceUID') });
  expect(r.value.studyInstanceUid).toBe(value(ref, 'StudyInstanceUID'));
  expect(r.value.patientId).toBe(value(ref, 'PatientID'));
  return { summary: r.value, ref };
};

describe('readObjectSummary', () => {
  it('an RT Plan: its frame of reference as dcmdump reads it', () => {
    const { summary, ref } = expectSummaryAsDcmdump(demoPlan('four-field-box.dcm'), 'plan');
    expect(summary.frameOfReferenceUid).toBe(value(ref, 'FrameOfReferenceUID'));
  });
  it('a CT slice', () => {
    const [slice] = writeCtPhantom(dir, {
      name: 's',
      columns: 4,
      rows: 4,
      slices: 1,
      spacingMm: [2, 2, 3],
      originMm: [0, 0, 0],
      frameOfReferenceUid: FRAME,
      hu: () => 0,
    });
    expect(expectSummaryAsDcmdump(slice!, 'ct').summary.frameOfReferenceUid).toBe(FRAME);
  });
  it('an RT Structure Set: the frame of reference of its contours (it has none at the top level)', () => {
    const f = join(dir, 'rs.dcm');
    writeRtStruct(f, 'rs', FRAME, [
      {
        number: 1,
        name: 'BODY',
        type: 'EXTERNAL',
        contours: [
          [
            [0, 0, 0],
            [10, 0, 0],
            [10, 10, 0],
          ],
        ],
      },
    ]);
    const { summary, ref } = expectSummaryAsDcmdump(f, 'structures');
    expect(value(ref, 'FrameOfReferenceUID')).toBeUndefined();
    expect(value(items(ref, 'x30060010') /* (3006,0010) Referenced Frame of Reference Sequence */[0]!, 'FrameOfReferenceUID')).toBe(FRAME);
    expect(summary.frameOfReferenceUid).toBe(FRAME);
  });
  it('an RT Dose', () => {
    const f = join(dir, 'rd.dcm');
    writeRtDose(f, {
      name: 'rd',
      planSopInstanceUid: '1.2.3',
      frameOfReferenceUid: FRAME,
      summation: 'PLAN',
      columns: 2,
      rows: 2,
      frames: 2,
      spacingMm: 5,
      originMm: [0, 0, 0],
      doseGy: () => 1,
    });
    expect(expectSummaryAsDcmdump(f, 'dose').summary.frameOfReferenceUid).toBe(FRAME);
  });
  it('any other class is refused, naming the class found', () => {
    const f = join(dir, 'mr.dcm');
    const MR = '1.2.840.10008.5.1.4.1.1.4';
    writeFileSync(
      f,
      part10(
        '1.2.840.10008.1.2.1',
        Buffer.concat([explicit(0x0008, 0x0016, 'UI', text(MR, 'UI')), explicit(0x0008, 0x0018, 'UI', text('1.2.3.4', 'UI'))]),
        MR,
      ),
    );
    const r = readObjectSummary(f);
    expect(!r.ok && r.issues[0]).toMatchObject({ code: 'not-rt-plan', path: 'SOPClassUID', found: MR });
  });
});
