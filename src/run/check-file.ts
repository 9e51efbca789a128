import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { checkPlan, type CheckOptions } from '../check/index.js';
import { importPlanBytes, SOP_CLASS_NAMES } from '../dicom/index.js';
import { type Issue, note, type PlanCheck } from '../model/index.js';
import type { CollectedFile } from './collect-files.js';
import { withWarnings } from './with-warnings.js';

/** A file's plan result, or why it was refused, or why a file found in a folder was left aside. */
export interface FileOutcome {
  readonly plan?: PlanCheck;
  readonly refused: Issue[];
  readonly skipped?: { readonly file: string; readonly reason: string };
}

/**
 * In a folder, other objects of a study (CT, structures, RT Dose, any storage class the standard
 * names) and files that are plainly no DICOM (notes, spreadsheets) are left aside, each said; a
 * `.dcm` file that is no readable DICOM, or DICOM of no class the standard names, is refused.
 */
function leftAside(f: CollectedFile, issues: readonly Issue[]): FileOutcome | undefined {
  if (f.explicit || issues.length !== 1) return undefined;
  const i = issues[0]!;
  if (i.code === 'not-rt-plan' && i.found && SOP_CLASS_NAMES[i.found])
    return { refused: [], skipped: { file: f.path, reason: `not an RT Plan (${SOP_CLASS_NAMES[i.found]})` } };
  if (i.code === 'not-dicom' && !/\.dcm$/i.test(f.path)) return { refused: [], skipped: { file: f.path, reason: 'not a DICOM file' } };
  return undefined;
}

/**
 * One file of a `check` run: read, imported and checked; a file found in a folder that is no plan
 * is skipped, anything else unreadable is refused. With CT series, the plan uses the one in its frame
 * of reference (or the single one given for a single plan, whose mismatch the check then reports).
 */
export function checkFile(
  f: CollectedFile,
  o: Omit<CheckOptions, 'ct'> & { cts: readonly NonNullable<CheckOptions['ct']>[]; singlePlan: boolean },
): FileOutcome {
  if (f.problem?.kind === 'skip') return { refused: [], skipped: { file: f.path, reason: f.problem.reason } };
  if (f.problem) return { refused: [{ severity: 'error', code: 'unreadable', file: f.path, message: f.problem.reason }] };
  let bytes: Buffer;
  try {
    bytes = readFileSync(f.path);
  } catch (e) {
    return {
      refused: [
        { severity: 'error', code: 'unreadable', file: f.path, message: `cannot read the file (${(e as NodeJS.ErrnoException).code ?? String(e)})` },
      ],
    };
  }
  const r = importPlanBytes(bytes, f.path);
  if (!r.ok) {
    return leftAside(f, r.issues) ?? { refused: [...r.issues] };
  }
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const { cts, singlePlan, ...options } = o;
  const own =
    cts.find((c) => c.volume.frameOfReferenceUid === r.value.plan.frameOfReferenceUid) ?? (cts.length === 1 && singlePlan ? cts[0] : undefined);
  const checked = checkPlan(r.value.plan, { path: f.path, sha256, importWarnings: r.warnings ?? [] }, { ...options, ...(own ? { ct: own } : {}) });
  const planWarnings = cts.length && !own ? [note('no-ct-in-frame')] : [];
  return { plan: withWarnings(checked, planWarnings), refused: [] };
}
