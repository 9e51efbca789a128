import { formatIssue } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { InspectDocument } from '../report/inspect-json.js';
import { planSummary } from '../report/plan-summary.js';
import { readPlans, VERSION } from '../run/index.js';
import type { CommandOutcome } from './outcome.js';

/** `plumbline inspect`: what was found in each plan, as text or one versioned JSON document. */
export function runInspect(paths: readonly string[], options: { json?: boolean }): CommandOutcome {
  const { plans, problems, notes } = readPlans(paths);
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
