import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { checkPlan, DEFAULT_POLICY } from '../../src/check/index.js';
import { importPlanFile } from '../../src/dicom/index.js';
import type { BeamCheck, CheckedBeam, MachineModel, NotCheckedBeam, Plan, PlanCheck } from '../../src/model/index.js';
import { RT_PLAN_STORAGE, writeDataset } from '../../scripts/lib/dcmjs-writer.js';
import { type BeamSpec, coordinatesDoseReference, type PlanSpec, planDataset, staticBeam } from '../../scripts/fixtures/plan-parts.js';

const work = mkdtempSync(join(tmpdir(), 'plumbline-check-'));

/** Writes a plan from a specification with dcmjs and reads it back with the importer. */
export function planFromSpec(spec: PlanSpec): { file: string; plan: Plan } {
  const file = join(work, spec.file);
  writeDataset(file, planDataset(spec), RT_PLAN_STORAGE);
  const r = importPlanFile(file);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return { file, plan: r.value.plan };
}

export function importOrThrow(file: string): Plan {
  const r = importPlanFile(file);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.value.plan;
}

export function check(
  plan: Plan,
  machine: MachineModel,
  options: { aliases?: Record<string, string>; point?: [number, number, number]; suggest?: boolean; explain?: boolean } = {},
): PlanCheck {
  return checkPlan(
    plan,
    { path: 'test.dcm', sha256: '0' },
    {
      machine,
      policy: DEFAULT_POLICY,
      aliases: new Map(Object.entries(options.aliases ?? {})),
      ...(options.point ? { pointPatientMm: options.point } : {}),
      suggestPoint: options.suggest ?? false,
      ...(options.explain ? { explainAll: true } : {}),
    },
  );
}

/**
 * A beam of a result as the tests read it: a checked beam's fields, and a not-checked beam's reason,
 * either present or absent (a test asserts the status it expects before reading the rest).
 */
export type TestBeam = Omit<CheckedBeam, 'status'> & { status: BeamCheck['status']; reason?: NotCheckedBeam['reason'] };

/** Every beam of every fraction group. */
export const beams = (r: PlanCheck | Pick<PlanCheck, 'fractionGroups'>): TestBeam[] => r.fractionGroups.flatMap((g) => g.beams) as TestBeam[];

/** A one-beam test plan whose Beam Dose is stated at `point` (MU and dose as given, 200 MU and 2 Gy by default), imported back. */
export function oneBeamPlan(
  name: string,
  beam: BeamSpec,
  point: readonly [number, number, number],
  o: { mu?: number; doseGy?: number; patientId?: string } = {},
): Plan {
  return planFromSpec({
    file: `${name}.dcm`,
    patientId: o.patientId ?? 'TEST-1',
    patientName: 'Test^Plan',
    label: name,
    name,
    description: 'test',
    doseReferences: [coordinatesDoseReference(1, 'point', point, 2)],
    fractionGroups: [
      { number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: o.mu ?? 200, doseGy: o.doseGy ?? 2, specPoint: point }] },
    ],
    beams: [beam],
  }).plan;
}

export interface ElectronExtra {
  readonly applicator?: string;
  readonly cutout?: readonly (readonly [number, number])[];
  readonly block?: BeamSpec['block'];
  readonly noApplicator?: boolean;
  readonly depthData?: { depthMm: number; equivalentDepthMm: number; ssdMm: number };
}

/** A 9 MeV AP electron beam (applicator A10 unless said, SSD 100 cm) with its point `depthMm` below the skin at the isocenter, checked. */
export function electronPlanCheck(name: string, depthMm: number, extra: ElectronExtra, machine: MachineModel): PlanCheck {
  const beam = staticBeam(1, 'E9', 9, 0, 1000, [0, 0, 0], {
    radiation: 'ELECTRON',
    ...(extra.noApplicator ? {} : { applicator: { id: extra.applicator ?? 'A10', type: 'ELECTRON_SQUARE', description: 'cone' } }),
    ...(extra.cutout ? { cutout: extra.cutout } : {}),
    ...(extra.block ? { block: extra.block } : {}),
    ...(extra.depthData ? { depthData: extra.depthData } : {}),
    first: { jawsXMm: [-100, 100], jawsYMm: [-100, 100] },
  });
  return check(oneBeamPlan(name, beam, [0, depthMm, 0], { patientId: 'E-1' }), machine);
}

/** The one beam of a one-beam test plan checked (its Beam Dose at `point`, the isocenter by default). */
export function checkOneBeam(name: string, b: BeamSpec, machine: MachineModel, point: [number, number, number] = [0, 0, 0]): TestBeam {
  return beams(check(oneBeamPlan(name, b, point, { patientId: 'W-1' }), machine))[0]!;
}

/** An AP 15 × 15 field with a 30° physical wedge (the demo machine's W30) at the given orientation, isocenter 10 cm deep. */
export function w30Beam(orientationDeg: number): BeamSpec {
  return staticBeam(1, 'AP W30', 6, 0, 900, [0, 0, 0], {
    wedge: { id: 'W30', angle: 30, factor: 0.68, orientation: orientationDeg },
    first: { wedgeIn: true, jawsXMm: [-75, 75], jawsYMm: [-75, 75] },
  });
}

/** A factor of a checked beam's calculation by its key (Sc, WF, WP …). */
export const factorOf = (b: TestBeam, key: string) => b.calculation!.factors.find((f) => f.key === key);
