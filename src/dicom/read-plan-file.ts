import { readFileSync, statSync } from 'node:fs';
import type { Plan, PlanSource, Result } from '../model/index.js';
import { parseDicomBytes, type ParseOptions } from './parse-bytes.js';
import { readRtPlan } from './rt-plan/read-rt-plan.js';

export interface ReadPlanOptions extends ParseOptions {
  /** Refuse files larger than this many bytes before reading them (an RT Plan is rarely over a few MB). */
  readonly maxFileBytes?: number;
}

export interface ImportedPlan {
  readonly plan: Plan;
  readonly source: PlanSource;
}

const DEFAULT_MAX_FILE_BYTES = 512 * 1024 * 1024;

/** Reads RT Plan bytes into a `Plan`, or the issues that prevent a faithful reading. Never throws. */
export function importPlanBytes(bytes: Uint8Array, file: string, options: ParseOptions = {}): Result<ImportedPlan> {
  const parsed = parseDicomBytes(bytes, file, options);
  if (!parsed.ok) return parsed;
  const { dataSet, transferSyntaxUid, hasPart10Header } = parsed.value;
  let plan: Result<Plan>;
  try {
    plan = readRtPlan(dataSet, file);
  } catch {
    // dicom-parser reads values lazily; a corrupt element can still throw here.
    return {
      ok: false,
      issues: [{ severity: 'error', code: 'unreadable', file, message: 'the dataset cannot be read: a value is corrupt where it is stored' }],
    };
  }
  if (!plan.ok) return plan;
  return { ok: true, value: { plan: plan.value, source: { file, transferSyntaxUid, hasPart10Header } }, warnings: plan.warnings };
}

/** Reads an RT Plan file; a missing, unreadable or oversized file is an issue, not an exception. */
export function importPlanFile(file: string, options: ReadPlanOptions = {}): Result<ImportedPlan> {
  let bytes: Buffer;
  try {
    const size = statSync(file).size;
    const max = options.maxFileBytes ?? DEFAULT_MAX_FILE_BYTES;
    if (size > max) {
      return {
        ok: false,
        issues: [
          {
            severity: 'error',
            code: 'too-large',
            file,
            message: 'the file is larger than the limit',
            expected: `at most ${max} bytes`,
            found: `${size}`,
          },
        ],
      };
    }
    bytes = readFileSync(file);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    return {
      ok: false,
      issues: [
        { severity: 'error', code: 'unreadable', file, message: code === 'ENOENT' ? 'no such file' : `cannot read the file (${code ?? String(e)})` },
      ],
    };
  }
  return importPlanBytes(bytes, file, options);
}
