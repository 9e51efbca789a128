import { z } from 'zod';
import { findElectronBeam, findPhotonBeam, loadMachine } from '../beamdata/index.js';
import type { ElectronPointInput, Issue, MachineModel, PhotonPointInput } from '../model/index.js';
import { formatIssue } from '../model/index.js';
import { electronDosePerMu, electronIsodoseDepthCm, muForDose, photonDosePerMu } from '../physics/index.js';
import { calcDocument, calcText } from '../report/calc-report.js';
import { electronCalcDocument, electronCalcText } from '../report/electron-calc-report.js';
import { resolveBeamDataPath } from './beam-data-path.js';
import type { CommandOutcome } from './outcome.js';
import { VERSION } from './version.js';

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
  z.string().optional().transform((s, ctx) => {
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
    cutout: sidesOption('--cutout must be XxY in cm (a rectangle) or one equivalent square side')
      .transform((v) => v && (v.y === undefined ? { kind: 'equivalent-square' as const, sideCm: v.x, method: 'as given' } : { kind: 'rectangle' as const, xCm: v.x, yCm: v.y })),
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
  .refine((o) => o.applicator !== undefined || (o.setup !== undefined && o.field !== undefined && o.depth !== undefined), { message: 'a photon calculation needs --setup, --field and --depth (an electron one: --applicator)' })
  .refine((o) => o.applicator === undefined || (o.depth === undefined) !== (o.isodose === undefined), { message: 'an electron calculation needs exactly one of --depth and --isodose' })
  .refine((o) => o.applicator !== undefined || (o.cutout === undefined && o.isodose === undefined), { message: '--cutout and --isodose are for electron beams (with --applicator)' });

/** `plumbline calc`: a manual point calculation with every factor shown. */
export function runCalc(raw: Record<string, unknown>): CommandOutcome {
  const parsed = CalcOptions.safeParse(raw);
  if (!parsed.success) return refuse(parsed.error.issues.map((i) => ({ severity: 'error', code: 'invalid-option', message: i.message })));
  const o = parsed.data;
  const loaded = loadMachine(resolveBeamDataPath(o.beamData));
  if (!loaded.ok) return refuse(loaded.issues);
  const { machine } = loaded.value;
  if (o.applicator !== undefined) return electronCalc(machine, { ...o, applicator: o.applicator }, loaded.warnings.map(formatIssue));
  const found = findPhotonBeam(machine, o.energy, o.fff);
  if (!found.ok) return refuse([found.issue]);
  const beam = found.beam;

  let trayId: string | undefined;
  if (o.tray === true) {
    if (beam.trays.length !== 1) {
      return refuse([{ severity: 'error', code: 'invalid-option', message: `--tray needs an ID: beam ${beam.id} has ${beam.trays.length} trays`,
        expected: beam.trays.map((t) => t.id).join(', ') || 'a beam with a tray' }]);
    }
    trayId = beam.trays[0]!.id;
  } else if (typeof o.tray === 'string') trayId = o.tray;

  // SSD setup: the surface at the given SSD (default the SAD). SAD setup: the point at the
  // isocenter unless an SSD is given, so SSD = SAD − depth.
  const depth = o.depth!;
  const ssdCm = o.ssd ?? (o.setup === 'SSD' ? machine.sadCm : machine.sadCm - depth);
  const ssdNote = o.ssd !== undefined ? 'given' : o.setup === 'SSD' ? 'the SAD, none given' : 'SAD − depth: the point at the isocenter, none given';
  if (!(ssdCm > 0)) return refuse([{ severity: 'error', code: 'invalid-option', message: `the depth ${depth} cm puts the surface behind the source`, expected: `depth < ${machine.sadCm} cm` }]);
  const input: PhotonPointInput = {
    setup: o.setup!,
    collimatorFieldCm: o.field!,
    ...(o.irradiated !== undefined ? { irradiatedSquareCm: o.irradiated } : {}),
    depthCm: depth,
    ssdCm,
    ...(o.offAxis !== undefined ? { offAxisCm: o.offAxis } : {}),
    ...(o.wedge !== undefined ? { wedgeId: o.wedge } : {}),
    ...(trayId !== undefined ? { trayId } : {}),
  };
  const r = photonDosePerMu(beam, machine.sadCm, input);
  if (!r.ok) return refuse(r.issues);
  const given = o.mu !== undefined ? 'mu' : 'dose';
  const mu = o.mu ?? muForDose(r.value, o.dose!);
  const doseCGy = o.dose ?? o.mu! * r.value.dosePerMuCGy;
  const report = { machine, beam, input, result: r.value, mu, doseCGy, given, ssdNote } as const;
  const warnings = loaded.warnings.map(formatIssue);
  if (o.json) return { stdout: [JSON.stringify(calcDocument(report, VERSION), null, 2)], stderr: warnings, exitCode: 0 };
  return { stdout: calcText(report), stderr: warnings, exitCode: 0 };
}

/** The electron calculation: applicator and cutout, the depth given or that of a stated isodose, SSD (default the nominal). */
function electronCalc(machine: MachineModel, o: z.infer<typeof CalcOptions> & { applicator: string }, warnings: string[]): CommandOutcome {
  const found = findElectronBeam(machine, o.energy);
  if (!found.ok) return refuse([found.issue]);
  const beam = found.beam;
  const app = beam.applicators.find((a) => a.id === o.applicator);
  if (!app) return refuse([{ severity: 'error', code: 'missing-table', message: `electron beam ${beam.id} has no applicator "${o.applicator}"`, expected: beam.applicators.map((a) => a.id).join(', '), found: o.applicator }]);
  const field: ElectronPointInput['field'] = o.cutout ?? { kind: 'equivalent-square', sideCm: app.sideCm, method: 'the open applicator' };
  const depthCm = o.depth ?? electronIsodoseDepthCm(beam, field, o.isodose!);
  if (depthCm === undefined) return refuse([{ severity: 'error', code: 'out-of-range', message: `the ${o.isodose} % isodose is not reached beyond dmax within ${beam.id}'s PDD table for this cutout`, expected: 'an isodose level the PDD passes through beyond dmax' }]);
  const input: ElectronPointInput = { applicatorId: app.id, field, depthCm, ssdCm: o.ssd ?? beam.calibration.ssd0Cm };
  const r = electronDosePerMu(beam, input);
  if (!r.ok) return refuse(r.issues);
  const given = o.mu !== undefined ? 'mu' : 'dose';
  const mu = o.mu ?? o.dose! / r.value.dosePerMuCGy;
  const doseCGy = o.dose ?? o.mu! * r.value.dosePerMuCGy;
  const report = { machine, beam, input, result: r.value, mu, doseCGy, given, ...(o.isodose !== undefined ? { isodosePercent: o.isodose } : {}) } as const;
  if (o.json) return { stdout: [JSON.stringify(electronCalcDocument(report, VERSION), null, 2)], stderr: warnings, exitCode: 0 };
  return { stdout: electronCalcText(report), stderr: warnings, exitCode: 0 };
}

function refuse(issues: readonly Issue[]): CommandOutcome {
  return { stdout: [], stderr: issues.map(formatIssue), exitCode: 2 };
}
