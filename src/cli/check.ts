import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import cliProgress from 'cli-progress';
import { z } from 'zod';
import { loadMachine } from '../beamdata/index.js';
import { checkPlan } from '../check/index.js';
import { importPlanBytes, readRtDose } from '../dicom/index.js';
import type { DoseGrid, Issue, PlanCheck } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { checkHtml } from '../report/check-html.js';
import { checkText } from '../report/check-text.js';
import { writeFileAtomic } from './atomic-write.js';
import { resolveBeamDataPath } from './beam-data-path.js';
import { collectFiles } from './collect-files.js';
import { checkDocument, loadPolicy } from './check-document.js';
import { loadPatientCts } from './patient-ct.js';
import type { CommandOutcome } from './outcome.js';

const Point = z.string().transform((s, ctx) => {
  const parts = s.split(',').map((v) => Number(v.trim()));
  if (parts.length !== 3 || parts.some((v) => !Number.isFinite(v))) {
    ctx.addIssue({ code: 'custom', message: `--point must be x,y,z in mm (patient coordinates), found "${s}"` });
    return z.NEVER;
  }
  return parts as [number, number, number];
});

export const CheckOptionsSchema = z.object({
  beamData: z.string().min(1),
  policy: z.string().min(1).optional(),
  point: Point.optional(),
  machineAlias: z.array(z.string().regex(/^[^=]+=[^=]+$/, '--machine-alias must be PLANNAME=DATANAME')).default([]),
  json: z.boolean().default(false),
  html: z.string().min(1).optional(),
  suggestPoint: z.boolean().default(false),
  ct: z.array(z.string().min(1)).optional(),
  dose: z.array(z.string().min(1)).optional(),
  structures: z.string().min(1).optional(),
  density: z.string().min(1).optional(),
  heterogeneity: z.enum(['tpr-ratio', 'batho'], { message: '--heterogeneity must be tpr-ratio or batho' }).default('tpr-ratio'),
  bodyThreshold: z.string().regex(/^-?\d+$/, '--body-threshold must be an integer HU').transform(Number).optional(),
});

/** `plumbline check`: read every plan, check it against the beam data, report; batch runs go on past bad files. */
export function runCheck(paths: readonly string[], raw: Record<string, unknown>): CommandOutcome {
  const parsed = CheckOptionsSchema.safeParse(raw);
  if (!parsed.success) return refuse(parsed.error.issues.map((i) => ({ severity: 'error', code: 'invalid-option', message: i.message })));
  const o = parsed.data;
  const loaded = loadMachine(resolveBeamDataPath(o.beamData));
  if (!loaded.ok) return refuse(loaded.issues);
  const policy = loadPolicy(o.policy);
  if (!policy.ok) return refuse(policy.issues);
  const aliases = new Map(o.machineAlias.map((a) => a.split('=') as [string, string]));
  const ct = o.ct ? loadPatientCts(o.ct, o.density, o.bodyThreshold ?? policy.value.ct.bodyThresholdHu, o.structures) : undefined;
  if (ct && !ct.ok) return refuse(ct.issues);
  const doseGrids: DoseGrid[] = [];
  for (const f of o.dose ?? []) {
    const g = readRtDose(f);
    if (!g.ok) return refuse(g.issues);
    doseGrids.push(g.value);
  }

  const files = collectFiles(paths);
  const bar = process.stderr.isTTY && files.length > 1 ? new cliProgress.SingleBar({ stream: process.stderr, format: 'checking {bar} {value}/{total} files' }, cliProgress.Presets.shades_classic) : undefined;
  bar?.start(files.length, 0);
  const plans: PlanCheck[] = [];
  const refused: Issue[] = [];
  for (const f of files) {
    bar?.increment();
    let bytes: Buffer;
    try {
      bytes = readFileSync(f.path);
    } catch (e) {
      refused.push({ severity: 'error', code: 'unreadable', file: f.path, message: `cannot read the file (${(e as NodeJS.ErrnoException).code ?? String(e)})` });
      continue;
    }
    const r = importPlanBytes(bytes, f.path);
    if (!r.ok) {
      // In a folder, other DICOM objects (CT, structures) and non-DICOM files are not plans: skip them.
      if (!f.explicit && r.issues.every((i) => i.code === 'not-rt-plan' || i.code === 'not-dicom')) continue;
      refused.push(...r.issues);
      continue;
    }
    const sha256 = createHash('sha256').update(bytes).digest('hex');
    // The CT in the plan's frame of reference; with a single CT series given for a single plan, a
    // mismatch is the user's error and the check says so (naming both frames).
    const cts = ct?.ok ? ct.value : [];
    const own = cts.find((c) => c.volume.frameOfReferenceUid === r.value.plan.frameOfReferenceUid) ?? (cts.length === 1 && files.length === 1 ? cts[0] : undefined);
    const planWarnings = cts.length && !own ? [`no CT series in this plan's frame of reference among --ct: checked without CT`] : [];
    const checked = checkPlan(r.value.plan, { path: f.path, sha256 }, {
      machine: loaded.value.machine, policy: policy.value, aliases, ...(o.point ? { pointPatientMm: o.point } : {}), suggestPoint: o.suggestPoint,
      ...(own ? { ct: own } : {}), heterogeneity: o.heterogeneity,
      ...(doseGrids.length ? { doseGrids } : {}),
    });
    plans.push(planWarnings.length ? { ...checked, warnings: [...checked.warnings, ...planWarnings] } : checked);
  }
  bar?.stop();
  if (plans.length === 0 && refused.length === 0) refused.push({ severity: 'error', code: 'missing-attribute', message: `no RT Plan found in ${paths.join(', ')}` });

  const doc = checkDocument(plans, refused, loaded.value, policy.value);
  const stderr = loaded.warnings.map(formatIssue);
  if (o.html) {
    try {
      writeFileAtomic(o.html, checkHtml(doc));
      stderr.push(`wrote ${o.html}`);
    } catch (e) {
      return refuse([{ severity: 'error', code: 'unreadable', file: o.html, message: `cannot write the HTML report (${(e as NodeJS.ErrnoException).code ?? String(e)})` }]);
    }
  }
  const inputError = refused.length > 0 || plans.some((p) => p.issues.length > 0);
  const review = plans.some((p) => p.verdict !== 'within tolerance' || !p.fullyVerified);
  const exitCode = inputError ? 2 : review ? 1 : 0;
  return { stdout: o.json ? [JSON.stringify(doc, null, 2)] : checkText(doc), stderr: [...stderr, ...refused.map(formatIssue)], exitCode };
}

function refuse(issues: readonly Issue[]): CommandOutcome {
  return { stdout: [], stderr: issues.map(formatIssue), exitCode: 2 };
}
