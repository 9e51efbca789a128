import type { Issue, Result } from '../model/index.js';
import { CT_IMAGE_STORAGE } from './ct-series.js';
import { ItemReader } from './item-reader.js';
import { parseHead } from './read-head.js';
import { RT_DOSE_STORAGE } from './rt-dose.js';
import { RT_PLAN_STORAGE } from './rt-plan/read-rt-plan.js';
import { readRtStruct, RT_STRUCTURE_SET_STORAGE } from './rt-struct.js';

export type ObjectKind = 'plan' | 'ct' | 'structures' | 'dose';

/** The storage SOP classes the check uses, by kind. */
export const STORAGE_CLASSES: Readonly<Record<ObjectKind, string>> = {
  plan: RT_PLAN_STORAGE,
  ct: CT_IMAGE_STORAGE,
  structures: RT_STRUCTURE_SET_STORAGE,
  dose: RT_DOSE_STORAGE,
};

/** What intake needs to know of an object before checking anything: what it is and where it belongs. */
export interface ObjectSummary {
  readonly kind: ObjectKind;
  readonly sopClassUid: string;
  readonly sopInstanceUid: string;
  readonly studyInstanceUid?: string;
  /** The frame of reference the object lives in (for structures: that of its contours). */
  readonly frameOfReferenceUid?: string;
  readonly patientId?: string;
}

/** The summary of a DICOM file, or the issue why it is not one of the objects the check uses. */
export function readObjectSummary(file: string): Result<ObjectSummary> {
  const head = parseHead(file);
  if (!head.ok) return head;
  const issues: Issue[] = [];
  const r = new ItemReader(head.value.parsed.dataSet, { file, path: '' }, issues, 'latin1');
  const sopClassUid = r.string('SOPClassUID');
  const sopInstanceUid = r.string('SOPInstanceUID');
  const kind = (Object.keys(STORAGE_CLASSES) as ObjectKind[]).find((k) => STORAGE_CLASSES[k] === sopClassUid);
  if (!kind || !sopClassUid || !sopInstanceUid) {
    return {
      ok: false,
      issues: [
        {
          severity: 'error',
          code: 'not-rt-plan',
          file,
          path: 'SOPClassUID',
          message: 'not an object the check uses (RT Plan, CT Image, RT Structure Set, RT Dose)',
          found: sopClassUid ?? 'none',
        },
      ],
    };
  }
  let frame = r.string('FrameOfReferenceUID');
  if (kind === 'structures' && !frame) {
    const rs = readRtStruct(file);
    frame = rs.ok ? rs.value.structures.find((s) => s.frameOfReferenceUid)?.frameOfReferenceUid : undefined;
  }
  const study = r.string('StudyInstanceUID');
  const patient = r.string('PatientID');
  return {
    ok: true,
    value: {
      kind,
      sopClassUid,
      sopInstanceUid,
      ...(study ? { studyInstanceUid: study } : {}),
      ...(frame ? { frameOfReferenceUid: frame } : {}),
      ...(patient ? { patientId: patient } : {}),
    },
  };
}
