import cliProgress from 'cli-progress';
import { z } from 'zod';
import type { Issue } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { checkHtml } from '../report/check-html.js';
import { checkText } from '../report/check-text.js';
import { needsAttention } from '../report/plan-headline.js';
import { beamDataStamp, checkDocument, checkFiles, collectFiles, loadCheckInputs } from '../run/index.js';
import { writeFileAtomic } from './atomic-write.js';
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
  explain: z.boolean().default(false),
  factors: z.boolean().default(false),
  ct: z.array(z.string().min(1)).optional(),
  dose: z.array(z.string().min(1)).optional(),
  structures: z.string().min(1).optional(),
  density: z.string().min(1).optional(),
  heterogeneity: z.enum(['tpr-ratio', 'batho'], { message: '--heterogeneity must be tpr-ratio or batho' }).default('tpr-ratio'),
  bodyThreshold: z
    .string()
    .regex(/^-?\d+$/, '--body-threshold must be an integer HU')
    .transform(Number)
    .optional(),
  threads: z
    .string()
    .regex(/^[1-9]\d*$/, '--threads must be a whole number of at least 1')
    .transform(Number)
    .refine((n) => n <= 64, '--threads must be at most 64')
    .optional(),
});

/** `plumbline check`: read every plan, check it against the beam data, report; batch runs go on past bad files. */
export async function runCheck(paths: readonly string[], raw: Record<string, unknown>): Promise<CommandOutcome> {
  const parsed = CheckOptionsSchema.safeParse(raw);
  if (!parsed.success) return refuse(parsed.error.issues.map((i) => ({ severity: 'error', code: 'invalid-option', message: i.message })));
  const o = parsed.data;
  const inputs = loadCheckInputs(o);
  if (!inputs.ok) return refuse(inputs.issues);
  const files = collectFiles(paths);
  const bar =
    process.stderr.isTTY && files.length > 1
      ? new cliProgress.SingleBar({ stream: process.stderr, format: 'checking {bar} {value}/{total} files' }, cliProgress.Presets.shades_classic)
      : undefined;
  bar?.start(files.length, 0);
  const { plans, refused, skipped } = await checkFiles(files, inputs.value, o, () => bar?.increment());
  bar?.stop();
  if (plans.length === 0 && refused.length === 0)
    refused.push({ severity: 'error', code: 'missing-attribute', message: `no RT Plan found in ${paths.join(', ')}` });

  const doc = checkDocument(plans, refused, beamDataStamp(inputs.value.machine), inputs.value.policy, new Date());
  const stderr = [...inputs.value.warnings.map(formatIssue), ...skippedLines(skipped)];
  if (o.html) {
    try {
      writeFileAtomic(o.html, checkHtml(doc));
      stderr.push(`wrote ${o.html}`);
    } catch (e) {
      return refuse([
        {
          severity: 'error',
          code: 'unreadable',
          file: o.html,
          message: `cannot write the HTML report (${(e as NodeJS.ErrnoException).code ?? String(e)})`,
        },
      ]);
    }
  }
  const inputError = refused.length > 0 || plans.some((p) => p.issues.length > 0);
  const review = plans.some(needsAttention);
  const exitCode = inputError ? 2 : review ? 1 : 0;
  return {
    stdout: o.json ? [JSON.stringify(doc, null, 2)] : checkText(doc, { factors: o.factors }),
    stderr: [...stderr, ...refused.map(formatIssue)],
    exitCode,
  };
}

/** The files left aside in folders, one line per reason, naming the first few. */
function skippedLines(skipped: readonly { file: string; reason: string }[]): string[] {
  const byReason = new Map<string, string[]>();
  for (const s of skipped) byReason.set(s.reason, [...(byReason.get(s.reason) ?? []), s.file]);
  return [...byReason].map(
    ([reason, files]) => `skipped ${files.length} file(s), ${reason}: ${files.slice(0, 3).join(', ')}${files.length > 3 ? ', …' : ''}`,
  );
}

function refuse(issues: readonly Issue[]): CommandOutcome {
  return { stdout: [], stderr: issues.map(formatIssue), exitCode: 2 };
}
