import { readFileSync } from 'node:fs';
import type { DataSet } from 'dicom-parser';
import type { Issue, Result } from '../model/index.js';
import { ItemReader } from './item-reader.js';
import { parseDicomBytes } from './parse-bytes.js';

export interface DicomObject {
  readonly reader: ItemReader;
  readonly dataSet: DataSet;
  readonly transferSyntaxUid: string;
  /** Issues the reader records while the caller reads attributes. */
  readonly issues: Issue[];
}

/** Reads a file and checks it is of the expected SOP class; any failure is an issue naming the file. */
export function readDicomObject(file: string, sopClassUid: string, what: string): Result<DicomObject> {
  let bytes: Buffer;
  try {
    bytes = readFileSync(file);
  } catch (e) {
    return {
      ok: false,
      issues: [{ severity: 'error', code: 'unreadable', file, message: `cannot read the file (${(e as NodeJS.ErrnoException).code ?? String(e)})` }],
    };
  }
  const parsed = parseDicomBytes(bytes, file);
  if (!parsed.ok) return { ok: false, issues: [...parsed.issues] };
  const issues: Issue[] = [];
  const reader = new ItemReader(parsed.value.dataSet, { file, path: '' }, issues, 'latin1');
  const found = reader.string('SOPClassUID');
  if (found !== sopClassUid) {
    return {
      ok: false,
      issues: [
        {
          severity: 'error',
          code: 'invalid-value',
          file,
          path: 'SOPClassUID',
          message: `not an ${what}`,
          expected: sopClassUid,
          found: found ?? 'none',
        },
      ],
    };
  }
  return { ok: true, value: { reader, dataSet: parsed.value.dataSet, transferSyntaxUid: parsed.value.transferSyntaxUid, issues } };
}
