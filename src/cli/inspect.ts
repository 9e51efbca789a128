import { importPlanFile, type ImportedPlan } from '../dicom/index.js';
import type { Issue } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { InspectDocument } from '../report/inspect-json.js';
import { planSummary } from '../report/plan-summary.js';
import { collectFiles } from './collect-files.js';
import type { CommandOutcome } from './outcome.js';
import { VERSION } from './version.js';

/** In a folder, objects that are simply not RT Plans (CT slices, structure sets) are skipped, not errors. */
const SKIPPABLE_IN_FOLDER = new Set<Issue['code']>(['not-rt-plan', 'not-dicom']);

export function runInspect(paths: readonly string[], options: { json?: boolean }): CommandOutcome {
  const plans: { imported: ImportedPlan; warnings: readonly Issue[] }[] = [];
  const problems: Issue[] = [];
  const notes: string[] = [];
  let notDicom = 0;
  for (const f of collectFiles(paths)) {
    const r = importPlanFile(f.path);
    if (r.ok) plans.push({ imported: r.value, warnings: r.warnings });
    else if (!f.explicit && r.issues.every((i) => i.code === 'not-dicom')) notDicom++;
    else if (!f.explicit && r.issues.every((i) => SKIPPABLE_IN_FOLDER.has(i.code))) notes.push(`skipped ${f.path}: ${r.issues[0]!.message}`);
    else problems.push(...r.issues);
  }
  if (notDicom) notes.push(`skipped ${notDicom} file(s) in the folder(s) that are not DICOM`);
  if (plans.length === 0 && problems.length === 0) {
    problems.push({ severity: 'error', code: 'missing-attribute', message: `no RT Plan found in ${paths.join(', ')}` });
  }
  const exitCode = problems.length ? 2 : 0;
  if (options.json) {
    const doc = InspectDocument.parse({
      schemaVersion: 1,
      kind: 'plumbline.inspect',
      tool: { name: 'plumbline', version: VERSION },
      plans: plans.map((p) => ({ source: p.imported.source, plan: p.imported.plan, warnings: p.warnings })),
      problems,
      caution: CAUTION,
    });
    return { stdout: [JSON.stringify(doc, null, 2)], stderr: problems.map(formatIssue), exitCode };
  }
  const stdout: string[] = [];
  for (const p of plans) stdout.push(...planSummary(p.imported.plan, p.imported.source, p.warnings), '');
  if (plans.length) stdout.push(CAUTION);
  return { stdout, stderr: [...notes, ...problems.map(formatIssue)], exitCode };
}
