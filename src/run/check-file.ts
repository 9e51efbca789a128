import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { checkPlan, type CheckOptions } from '../check/index.js';
import { importPlanBytes } from '../dicom/index.js';
import { type Issue, note, type PlanCheck } from '../model/index.js';
import type { CollectedFile } from './collect-files.js';
import { withWarnings } from './with-warnings.js';

/** A file's plan result, or why it was refused (nothing: a non-plan found in a folder). */
export interface FileOutcome {
  readonly plan?: PlanCheck;
  readonly refused: Issue[];
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
    // In a folder, other DICOM objects (CT, structures) and non-DICOM files are not plans: skip them.
    if (!f.explicit && r.issues.every((i) => i.code === 'not-rt-plan' || i.code === 'not-dicom')) return { refused: [] };
    return { refused: [...r.issues] };
  }
  const sha256 = createHash('sha256').update(bytes).digest('hex');
  const { cts, singlePlan, ...options } = o;
  const own =
    cts.find((c) => c.volume.frameOfReferenceUid === r.value.plan.frameOfReferenceUid) ?? (cts.length === 1 && singlePlan ? cts[0] : undefined);
  const checked = checkPlan(r.value.plan, { path: f.path, sha256, importWarnings: r.warnings ?? [] }, { ...options, ...(own ? { ct: own } : {}) });
  const planWarnings = cts.length && !own ? [note('no-ct-in-frame')] : [];
  return { plan: withWarnings(checked, planWarnings), refused: [] };
}
