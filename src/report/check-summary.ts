import type { Issue, PlanCheck } from '../model/index.js';
import type { CheckDocument } from './check-json.js';

/** Counts over a batch: plans, beams checked and not, verdicts, files refused. */
export function checkSummary(plans: readonly PlanCheck[], refused: readonly Issue[]): CheckDocument['summary'] {
  const beams = plans.flatMap((p) => p.fractionGroups.flatMap((g) => g.beams));
  const verdicts = { 'within tolerance': 0, 'needs review': 0, 'not verified': 0, 'beyond action level': 0 };
  for (const p of plans) if (p.issues.length === 0) verdicts[p.verdict]++;
  return {
    plans: plans.length,
    beamsChecked: beams.filter((b) => b.status === 'checked').length,
    beamsNotChecked: beams.filter((b) => b.status !== 'checked').length,
    filesRefused: new Set(refused.map((i) => i.file)).size + plans.filter((p) => p.issues.length > 0).length,
    verdicts,
  };
}
