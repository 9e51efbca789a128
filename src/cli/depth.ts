import { z } from 'zod';
import type { Issue } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { depthText } from '../report/depth-report.js';
import { DEFAULT_POLICY, planDepthsFromCt } from '../run/index.js';
import type { CommandOutcome } from './outcome.js';

const Options = z.object({
  ct: z.array(z.string().min(1)).min(1),
  density: z.string().min(1).optional(),
  bodyThreshold: z
    .string()
    .regex(/^-?\d+$/, '--body-threshold must be an integer HU')
    .transform(Number)
    .optional(),
  json: z.boolean().default(false),
  structures: z.string().min(1).optional(),
});

/** `plumbline depth`: per beam, the SSD from the plan and from the CT, geometric and radiological depth. */
export function runDepth(planFile: string, raw: Record<string, unknown>): CommandOutcome {
  const parsed = Options.safeParse(raw);
  if (!parsed.success) return refuse(parsed.error.issues.map((i) => ({ severity: 'error', code: 'invalid-option', message: i.message })));
  const o = parsed.data;
  const r = planDepthsFromCt(planFile, {
    ct: o.ct,
    density: o.density,
    bodyThresholdHu: o.bodyThreshold ?? DEFAULT_POLICY.ct.bodyThresholdHu,
    structures: o.structures,
  });
  if (!r.ok) return refuse(r.issues);
  return {
    stdout: o.json ? [JSON.stringify(r.value, null, 2)] : depthText(r.value),
    stderr: [],
    exitCode: r.value.beams.some((b) => b.problem) ? 2 : 0,
  };
}

function refuse(issues: readonly Issue[]): CommandOutcome {
  return { stdout: [], stderr: issues.map(formatIssue), exitCode: 2 };
}
