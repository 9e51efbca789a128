import { importPlanFile, type ImportedPlan } from '../dicom/index.js';
import type { Issue } from '../model/index.js';
import { collectFiles } from './collect-files.js';

/** In a folder, objects that are simply not RT Plans (CT slices, structure sets) are skipped, not errors. */
const SKIPPABLE_IN_FOLDER = new Set<Issue['code']>(['not-rt-plan', 'not-dicom']);

/** The plans read from files and folders, the problems that refused files, and notes on what a folder held besides. */
export interface ReadPlans {
  readonly plans: readonly { imported: ImportedPlan; warnings: readonly Issue[] }[];
  readonly problems: readonly Issue[];
  readonly notes: readonly string[];
}

/** Reads every RT Plan among the paths (folders searched recursively); finding none is a problem. */
export function readPlans(paths: readonly string[]): ReadPlans {
  const plans: { imported: ImportedPlan; warnings: readonly Issue[] }[] = [];
  const problems: Issue[] = [];
  const notes: string[] = [];
  let notDicom = 0;
  for (const f of collectFiles(paths)) {
    if (f.problem?.kind === 'skip') {
      notes.push(`skipped ${f.path}: ${f.problem.reason}`);
      continue;
    }
    if (f.problem) {
      problems.push({ severity: 'error', code: 'unreadable', file: f.path, message: f.problem.reason });
      continue;
    }
    const r = importPlanFile(f.path);
    if (r.ok) plans.push({ imported: r.value, warnings: r.warnings ?? [] });
    else if (!f.explicit && r.issues.every((i) => i.code === 'not-dicom')) notDicom++;
    else if (!f.explicit && r.issues.every((i) => SKIPPABLE_IN_FOLDER.has(i.code))) notes.push(`skipped ${f.path}: ${r.issues[0]!.message}`);
    else problems.push(...r.issues);
  }
  if (notDicom) notes.push(`skipped ${notDicom} file(s) in the folder(s) that are not DICOM`);
  if (plans.length === 0 && problems.length === 0) {
    problems.push({ severity: 'error', code: 'missing-attribute', message: `no RT Plan found in ${paths.join(', ')}` });
  }
  return { plans, problems, notes };
}
