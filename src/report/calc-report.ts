import { z } from 'zod';
import {
  factorLabel,
  type LookupNote,
  Note,
  type MachineModel,
  type PhotonBeamModel,
  type PhotonPointInput,
  type PhotonPointResult,
} from '../model/index.js';

import { beamDataText } from './beam-data-text.js';
import { CAUTION } from './caution.js';
import type { CheckDocument } from './check-json.js';
import { noteText } from './note-text.js';
import { handCalculation } from './hand-calculation.js';

export interface CalcReport {
  readonly machine: MachineModel;
  readonly beam: PhotonBeamModel;
  readonly input: PhotonPointInput;
  readonly result: PhotonPointResult;
  readonly mu: number;
  readonly doseCGy: number;
  /** Which of the two was given; the other is computed. */
  readonly given: 'mu' | 'dose';
  readonly ssdNote: string;
  /** What the beam data are, validated and approved (see beamDataText), when the command knows it. */
  readonly beamData?: CheckDocument['beamData'];
  /** What makes this point or these MU unfit to rely on (steep depth dose, beyond the machine). */
  readonly flags: readonly Note[];
}

const note = (n: LookupNote) =>
  `${n.table}: ${n.axis} ${n.requested.toFixed(2)} ${n.unit} is outside the table (${n.range[0]} to ${n.range[1]} ${n.unit}); ` +
  `the edge value at ${n.used} ${n.unit} was used, as the beam data allow`;

/** The manual calculation as a physicist writes it: geometry, one factor per line, the result. */
export function calcText(r: CalcReport): string[] {
  const g = r.result.geometry;
  const out = [
    `Point dose calculation, ${r.input.setup} setup (AAPM TG-71 formalism)`,
    `  machine ${r.machine.name}, beam ${r.beam.id} (${r.beam.nominalEnergyMV} MV${r.beam.fff ? ' FFF' : ''}), ` +
      `beam data version ${r.machine.version}${r.machine.invented ? ' — INVENTED DEMO DATA, never for a patient' : ''}`,
    `  collimator ${r.input.collimatorFieldCm.x} x ${r.input.collimatorFieldCm.y} cm at the isocenter plane ` +
      `(Sc equivalent square ${g.collimatorSquareCm.toFixed(2)} cm)`,
    `  irradiated equivalent square ${g.surfaceSquareCm.toFixed(2)} cm at the surface, ${g.squareAtD0Cm.toFixed(2)} cm at d0, ` +
      `${g.squareAtDepthCm.toFixed(2)} cm at depth`,
    `  depth ${r.input.depthCm} cm, SSD ${r.input.ssdCm} cm (${r.ssdNote}), source to point ${g.sourceToPointCm.toFixed(2)} cm, off-axis ${g.offAxisCm} cm`,
    '',
    ...handCalculation(r.result.factors, r.result.dosePerMuCGy, r),
  ];
  if (r.result.clamps.length) out.push('', ...r.result.clamps.map((n) => `  note: ${note(n)}`));
  if (r.flags.length) out.push('', ...r.flags.map((f) => `  FLAG: ${noteText(f)}`));
  if (r.beamData) out.push('', `  ${beamDataText(r.beamData)}`);
  out.push('', CAUTION);
  return out;
}

export const CalcDocument = z.object({
  schemaVersion: z.literal(2),
  kind: z.literal('plumbline.calc'),
  tool: z.object({ name: z.literal('plumbline'), version: z.string() }),
  machine: z.object({ name: z.string(), dataVersion: z.string(), invented: z.boolean() }),
  beamData: z.string().optional(),
  beam: z.object({ id: z.string(), nominalEnergyMV: z.number(), fff: z.boolean() }),
  setup: z.enum(['SSD', 'SAD']),
  input: z.object({
    collimatorFieldCm: z.object({ x: z.number(), y: z.number() }),
    irradiatedSquareCm: z.number().optional(),
    depthCm: z.number(),
    ssdCm: z.number(),
    offAxisCm: z.number().optional(),
    wedgeId: z.string().optional(),
    trayId: z.string().optional(),
  }),
  geometry: z.object({
    sourceToPointCm: z.number(),
    collimatorSquareCm: z.number(),
    surfaceSquareCm: z.number(),
    squareAtD0Cm: z.number(),
    squareAtDepthCm: z.number(),
    offAxisCm: z.number(),
  }),
  factors: z.array(z.object({ key: z.string(), label: z.string(), value: z.number(), args: z.array(z.number()), name: z.string().optional() })),
  dosePerMuCGy: z.number(),
  mu: z.number(),
  doseCGy: z.number(),
  given: z.enum(['mu', 'dose']),
  clamps: z.array(
    z.object({
      table: z.string(),
      axis: z.string(),
      requested: z.number(),
      used: z.number(),
      kind: z.string(),
      range: z.tuple([z.number(), z.number()]),
      unit: z.string(),
    }),
  ),
  flags: z.array(Note),
  caution: z.string(),
});
export type CalcDocument = z.infer<typeof CalcDocument>;

export function calcDocument(r: CalcReport, version: string): CalcDocument {
  return CalcDocument.parse({
    schemaVersion: 2,
    kind: 'plumbline.calc',
    tool: { name: 'plumbline', version },
    machine: { name: r.machine.name, dataVersion: r.machine.version, invented: r.machine.invented },
    ...(r.beamData ? { beamData: beamDataText(r.beamData) } : {}),
    beam: { id: r.beam.id, nominalEnergyMV: r.beam.nominalEnergyMV, fff: r.beam.fff },
    setup: r.input.setup,
    input: r.input,
    geometry: r.result.geometry,
    factors: r.result.factors.map((f) => ({ ...f, label: factorLabel(f) })),
    dosePerMuCGy: r.result.dosePerMuCGy,
    mu: r.mu,
    doseCGy: r.doseCGy,
    given: r.given,
    flags: [...r.flags],
    clamps: r.result.clamps,
    caution: CAUTION,
  });
}
