import { z } from 'zod';
import { DEFAULT_POLICY, planDepths } from '../check/index.js';
import { importPlanFile } from '../dicom/index.js';
import type { Issue } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { CAUTION } from '../report/caution.js';
import { DepthDocument, depthText } from '../report/depth-report.js';
import type { CommandOutcome } from './outcome.js';
import { loadPatientCts } from './patient-ct.js';
import { VERSION } from './version.js';

const Options = z.object({
  ct: z.array(z.string().min(1)).min(1),
  density: z.string().min(1).optional(),
  bodyThreshold: z.string().regex(/^-?\d+$/, '--body-threshold must be an integer HU').transform(Number).optional(),
  json: z.boolean().default(false),
  structures: z.string().min(1).optional(),
});

/** `plumbline depth`: per beam, the SSD from the plan and from the CT, geometric and radiological depth. */
export function runDepth(planFile: string, raw: Record<string, unknown>): CommandOutcome {
  const parsed = Options.safeParse(raw);
  if (!parsed.success) return refuse(parsed.error.issues.map((i) => ({ severity: 'error', code: 'invalid-option', message: i.message })));
  const o = parsed.data;
  const imported = importPlanFile(planFile);
  if (!imported.ok) return refuse(imported.issues);
  const plan = imported.value.plan;
  const threshold = o.bodyThreshold ?? DEFAULT_POLICY.ct.bodyThresholdHu;
  const cts = loadPatientCts(o.ct, o.density, threshold, o.structures);
  if (!cts.ok) return refuse(cts.issues);
  const ct = cts.value.find((c) => c.volume.frameOfReferenceUid === plan.frameOfReferenceUid);
  if (!ct) {
    return refuse([{ severity: 'error', code: 'inconsistent', file: planFile, path: 'FrameOfReferenceUID', message: 'no CT series in the plan\'s frame of reference',
      expected: `the plan's ${plan.frameOfReferenceUid ?? '(none)'}`, found: cts.value.map((c) => c.volume.frameOfReferenceUid).join(', ') }]);
  }
  const rows = planDepths(plan, ct);
  const doc = DepthDocument.parse({
    schemaVersion: 1, kind: 'plumbline.depth', tool: { name: 'plumbline', version: VERSION }, plan: planFile,
    ct: { seriesInstanceUid: ct.volume.seriesInstanceUid, frameOfReferenceUid: ct.volume.frameOfReferenceUid, slices: ct.volume.slices, bodyThresholdHu: threshold, body: ct.bodySource, densityTable: ct.densityTable },
    beams: rows, caution: CAUTION,
  });
  return { stdout: o.json ? [JSON.stringify(doc, null, 2)] : depthText(doc), stderr: [], exitCode: rows.some((r) => r.problem) ? 2 : 0 };
}

function refuse(issues: readonly Issue[]): CommandOutcome {
  return { stdout: [], stderr: issues.map(formatIssue), exitCode: 2 };
}
