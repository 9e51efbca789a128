import { z } from 'zod';
import { Note, type ElectronBeamModel, type ElectronPointInput, type ElectronPointResult, factorLabel, type MachineModel } from '../model/index.js';
import { beamDataText } from './beam-data-text.js';
import { CAUTION } from './caution.js';
import type { CheckDocument } from './check-json.js';
import { clampText, noteText } from './note-text.js';
import { handCalculation } from './hand-calculation.js';

export interface ElectronCalcReport {
  readonly machine: MachineModel;
  readonly beam: ElectronBeamModel;
  readonly input: ElectronPointInput;
  readonly result: ElectronPointResult;
  /** Set when the depth was found as the depth of a stated isodose. */
  readonly isodosePercent?: number;
  readonly mu: number;
  readonly doseCGy: number;
  readonly given: 'mu' | 'dose';
  /** What the beam data are, validated and approved (see beamDataText), when the command knows it. */
  readonly beamData?: CheckDocument['beamData'];
  /** What makes this point or these MU unfit to rely on (steep depth dose, beyond the machine). */
  readonly flags: readonly Note[];
}

const fieldText = (f: ElectronPointInput['field']) =>
  f.kind === 'rectangle'
    ? `cutout ${f.xCm} x ${f.yCm} cm at the nominal SSD (Se and PDD by the square-root rule)`
    : `cutout equivalent square ${f.sideCm.toFixed(2)} cm (${f.method})`;

/** The electron calculation as a physicist writes it: applicator, cutout, depth, one factor per line, the result. */
export function electronCalcText(r: ElectronCalcReport): string[] {
  return [
    'Point dose calculation, electron beam (AAPM TG-71 formalism)',
    `  machine ${r.machine.name}, beam ${r.beam.id} (${r.beam.nominalEnergyMeV} MeV), beam data version ` +
      `${r.machine.version}${r.machine.invented ? ' — INVENTED DEMO DATA, never for a patient' : ''}`,
    `  applicator ${r.input.applicatorId}, ${fieldText(r.input.field)}`,
    `  depth ${r.input.depthCm.toFixed(2)} cm` +
      `${r.isodosePercent !== undefined ? ` (the depth of the ${r.isodosePercent} % isodose on the central axis)` : ''}, SSD ${r.input.ssdCm} cm ` +
      `(air gap ${r.result.airGapCm.toFixed(1)} cm, effective SSD ${r.result.effectiveSsdCm.toFixed(1)} cm)`,
    '',
    ...handCalculation(r.result.factors, r.result.dosePerMuCGy, r),
    ...r.result.clamps.map((n) => `  note: ${clampText(n)}, as the beam data allow`),
    ...r.flags.map((f) => `  FLAG: ${noteText(f)}`),
    ...(r.beamData ? ['', `  ${beamDataText(r.beamData)}`] : []),
    '',
    CAUTION,
  ];
}

export const ElectronCalcDocument = z.object({
  schemaVersion: z.literal(2),
  kind: z.literal('plumbline.electron-calc'),
  tool: z.object({ name: z.literal('plumbline'), version: z.string() }),
  machine: z.object({ name: z.string(), dataVersion: z.string(), invented: z.boolean() }),
  beamData: z.string().optional(),
  beam: z.object({ id: z.string(), nominalEnergyMeV: z.number() }),
  input: z.object({
    applicatorId: z.string(),
    field: z.union([
      z.object({ kind: z.literal('rectangle'), xCm: z.number(), yCm: z.number() }),
      z.object({ kind: z.literal('equivalent-square'), sideCm: z.number(), method: z.string() }),
    ]),
    depthCm: z.number(),
    ssdCm: z.number(),
  }),
  isodosePercent: z.number().optional(),
  airGapCm: z.number(),
  effectiveSsdCm: z.number(),
  factors: z.array(z.object({ key: z.string(), label: z.string(), value: z.number(), args: z.array(z.number()), name: z.string().optional() })),
  dosePerMuCGy: z.number(),
  mu: z.number(),
  doseCGy: z.number(),
  given: z.enum(['mu', 'dose']),
  flags: z.array(Note),
  caution: z.string(),
});

export function electronCalcDocument(r: ElectronCalcReport, version: string): z.infer<typeof ElectronCalcDocument> {
  return ElectronCalcDocument.parse({
    schemaVersion: 2,
    kind: 'plumbline.electron-calc',
    tool: { name: 'plumbline', version },
    machine: { name: r.machine.name, dataVersion: r.machine.version, invented: r.machine.invented },
    ...(r.beamData ? { beamData: beamDataText(r.beamData) } : {}),
    beam: { id: r.beam.id, nominalEnergyMeV: r.beam.nominalEnergyMeV },
    input: r.input,
    ...(r.isodosePercent !== undefined ? { isodosePercent: r.isodosePercent } : {}),
    airGapCm: r.result.airGapCm,
    effectiveSsdCm: r.result.effectiveSsdCm,
    factors: r.result.factors.map((f) => ({ ...f, args: [...f.args], label: factorLabel(f) })),
    dosePerMuCGy: r.result.dosePerMuCGy,
    mu: r.mu,
    doseCGy: r.doseCGy,
    given: r.given,
    flags: [...r.flags],
    caution: CAUTION,
  });
}
