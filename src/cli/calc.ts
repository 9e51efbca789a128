import { z } from 'zod';
import type { Issue } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { calcDocument, calcText } from '../report/calc-report.js';
import { electronCalcDocument, electronCalcText } from '../report/electron-calc-report.js';
import { beamDataStamp, electronCalc, loadBeamData, photonCalc, VERSION } from '../run/index.js';
import type { CommandOutcome } from './outcome.js';

/** A number option: finite, and > 0 (or >= 0 when zero is allowed), else a message naming the option. */
const numberOption = (what: string, zeroAllowed: boolean) =>
  z.string().transform((s, ctx) => {
    const v = Number(s);
    if (s.trim() === '' || !Number.isFinite(v) || v < 0 || (!zeroAllowed && v === 0)) {
      ctx.addIssue({ code: 'custom', message: `${what} must be a ${zeroAllowed ? 'number >= 0' : 'positive number'}, found "${s}"` });
      return z.NEVER;
    }
    return v;
  });
const positive = (what: string) => numberOption(what, false);

/** `X` or `XxY` in cm, both positive: a square's side or a rectangle's sides (y absent for one side). */
const sidesOption = (message: string) =>
  z
    .string()
    .optional()
    .transform((s, ctx) => {
      if (s === undefined) return undefined;
      const m = /^\s*(\d+(?:\.\d+)?)\s*(?:[xX×]\s*(\d+(?:\.\d+)?))?\s*$/.exec(s);
      if (!m || Number(m[1]) <= 0 || (m[2] !== undefined && Number(m[2]) <= 0)) {
        ctx.addIssue({ code: 'custom', message: `${message}, found "${s}"` });
        return z.NEVER;
      }
      return { x: Number(m[1]), ...(m[2] !== undefined ? { y: Number(m[2]) } : {}) } as { x: number; y?: number };
    });

/** The options of `plumbline calc`, validated before anything is computed. */
export const CalcOptions = z
  .object({
    beamData: z.string().min(1),
    energy: positive('--energy (MV)'),
    fff: z.boolean().default(false),
    setup: z.enum(['SAD', 'SSD'], { message: '--setup must be SAD or SSD' }).optional(),
    field: sidesOption('--field must be XxY in cm (e.g. 10x12) or one side for a square').transform((v) => v && { x: v.x, y: v.y ?? v.x }),
    irradiated: positive('--irradiated (equivalent square, cm)').optional(),
    depth: numberOption('--depth (cm)', true).optional(),
    applicator: z.string().min(1).optional(),
    cutout: sidesOption('--cutout must be XxY in cm (a rectangle) or one equivalent square side').transform(
      (v) =>
        v &&
        (v.y === undefined
          ? { kind: 'equivalent-square' as const, sideCm: v.x, method: 'as given' }
          : { kind: 'rectangle' as const, xCm: v.x, yCm: v.y }),
    ),
    isodose: positive('--isodose (%)').optional(),
    mu: positive('--mu').optional(),
    dose: positive('--dose (cGy)').optional(),
    ssd: positive('--ssd (cm)').optional(),
    offAxis: numberOption('--off-axis (cm)', true).optional(),
    wedge: z.string().min(1).optional(),
    tray: z.union([z.boolean(), z.string().min(1)]).optional(),
    json: z.boolean().default(false),
  })
  .refine((o) => (o.mu === undefined) !== (o.dose === undefined), { message: 'give exactly one of --mu and --dose' })
  .refine((o) => o.applicator !== undefined || (o.setup !== undefined && o.field !== undefined && o.depth !== undefined), {
    message: 'a photon calculation needs --setup, --field and --depth (an electron one: --applicator)',
  })
  .refine((o) => o.applicator === undefined || (o.depth === undefined) !== (o.isodose === undefined), {
    message: 'an electron calculation needs exactly one of --depth and --isodose',
  })
  .refine((o) => o.applicator !== undefined || (o.cutout === undefined && o.isodose === undefined), {
    message: '--cutout and --isodose are for electron beams (with --applicator)',
  });

/** `plumbline calc`: a manual point calculation with every factor shown. */
export function runCalc(raw: Record<string, unknown>): CommandOutcome {
  const parsed = CalcOptions.safeParse(raw);
  if (!parsed.success) return refuse(parsed.error.issues.map((i) => ({ severity: 'error', code: 'invalid-option', message: i.message })));
  const o = parsed.data;
  const loaded = loadBeamData(o.beamData);
  if (!loaded.ok) return refuse(loaded.issues);
  const warnings = (loaded.warnings ?? []).map(formatIssue);
  const { machine } = loaded.value;
  const beamData = beamDataStamp(loaded.value);
  if (o.applicator !== undefined) {
    const e = electronCalc(machine, { ...o, applicator: o.applicator });
    if (!e.ok) return refuse(e.issues);
    const r = { ...e, value: { ...e.value, beamData } };
    return {
      stdout: o.json ? [JSON.stringify(electronCalcDocument(r.value, VERSION), null, 2)] : electronCalcText(r.value),
      stderr: warnings,
      // A flagged point (steep depth dose, MU beyond the machine) needs a physicist's look: as check, exit 1.
      exitCode: r.value.flags.length ? 1 : 0,
    };
  }
  const p = photonCalc(machine, { ...o, setup: o.setup!, field: o.field!, depth: o.depth! });
  if (!p.ok) return refuse(p.issues);
  const r = { ...p, value: { ...p.value, beamData } };
  return {
    stdout: o.json ? [JSON.stringify(calcDocument(r.value, VERSION), null, 2)] : calcText(r.value),
    stderr: warnings,
    exitCode: r.value.flags.length ? 1 : 0,
  };
}

function refuse(issues: readonly Issue[]): CommandOutcome {
  return { stdout: [], stderr: issues.map(formatIssue), exitCode: 2 };
}
