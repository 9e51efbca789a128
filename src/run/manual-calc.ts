import { findElectronBeam, findPhotonBeam } from '../beamdata/index.js';
import { buildUpFlags, electronDepthFlags } from '../check/index.js';
import {
  type ElectronPointInput,
  type Issue,
  type MachineModel,
  note,
  type Note,
  type PhotonPointInput,
  type Refused,
  type Result,
} from '../model/index.js';
import { electronDmaxCm, electronDosePerMu, electronIsodoseDepthCm, muForDose, photonDosePerMu } from '../physics/index.js';
import type { CalcReport } from '../report/calc-report.js';
import type { ElectronCalcReport } from '../report/electron-calc-report.js';

const refuse = (issues: readonly Issue[]): Refused => ({ ok: false, issues });

/** MU beyond what the machine delivers in one beam (its beam data's limits), as `check` refuses them. */
const muFlags = (machine: MachineModel, mu: number): Note[] =>
  machine.limits && mu > machine.limits.maxMuPerBeam
    ? [note('mu-beyond-machine', { mu, maxMu: machine.limits.maxMuPerBeam, machine: machine.name })]
    : [];

/** A manual photon calculation, as `calc` is asked for it (lengths in cm; exactly one of MU and dose). */
export interface PhotonCalcRequest {
  readonly energy: number;
  readonly fff: boolean;
  readonly setup: 'SAD' | 'SSD';
  readonly field: { x: number; y: number };
  readonly irradiated?: number | undefined;
  readonly depth: number;
  readonly ssd?: number | undefined;
  readonly offAxis?: number | undefined;
  readonly wedge?: string | undefined;
  /** `true`: the beam's one tray; a string: that tray's ID. */
  readonly tray?: boolean | string | undefined;
  readonly mu?: number | undefined;
  readonly dose?: number | undefined;
}

/** The photon point dose with every factor, for the planned MU or the MU for a dose. */
export function photonCalc(machine: MachineModel, o: PhotonCalcRequest): Result<CalcReport> {
  const found = findPhotonBeam(machine, o.energy, o.fff);
  if (!found.ok) return found;
  const beam = found.value;
  let trayId: string | undefined;
  if (o.tray === true) {
    if (beam.trays.length !== 1) {
      return refuse([
        {
          severity: 'error',
          code: 'invalid-option',
          message: `--tray needs an ID: beam ${beam.id} has ${beam.trays.length} trays`,
          expected: beam.trays.map((t) => t.id).join(', ') || 'a beam with a tray',
        },
      ]);
    }
    trayId = beam.trays[0]!.id;
  } else if (typeof o.tray === 'string') trayId = o.tray;
  // SSD setup: the surface at the given SSD (default the SAD). SAD setup: the point at the
  // isocenter unless an SSD is given, so SSD = SAD − depth.
  const ssdCm = o.ssd ?? (o.setup === 'SSD' ? machine.sadCm : machine.sadCm - o.depth);
  const ssdNote = o.ssd !== undefined ? 'given' : o.setup === 'SSD' ? 'the SAD, none given' : 'SAD − depth: the point at the isocenter, none given';
  if (!(ssdCm > 0))
    return refuse([
      {
        severity: 'error',
        code: 'invalid-option',
        message: `the depth ${o.depth} cm puts the surface behind the source`,
        expected: `depth < ${machine.sadCm} cm`,
      },
    ]);
  const input: PhotonPointInput = {
    setup: o.setup,
    collimatorFieldCm: o.field,
    ...(o.irradiated !== undefined ? { irradiatedSquareCm: o.irradiated } : {}),
    depthCm: o.depth,
    ssdCm,
    ...(o.offAxis !== undefined ? { offAxisCm: o.offAxis } : {}),
    ...(o.wedge !== undefined ? { wedgeId: o.wedge } : {}),
    ...(trayId !== undefined ? { trayId } : {}),
  };
  const r = photonDosePerMu(beam, machine.sadCm, input);
  if (!r.ok) return refuse(r.issues);
  const mu = o.mu ?? muForDose(r.value, o.dose!);
  const doseCGy = o.dose ?? o.mu! * r.value.dosePerMuCGy;
  const flags = [...buildUpFlags(o.depth, beam.calibration.dmaxCm), ...muFlags(machine, mu)];
  return { ok: true, value: { machine, beam, input, result: r.value, mu, doseCGy, given: o.mu !== undefined ? 'mu' : 'dose', ssdNote, flags } };
}

/** A manual electron calculation: applicator and cutout, the depth given or that of a stated isodose. */
export interface ElectronCalcRequest {
  readonly energy: number;
  readonly applicator: string;
  readonly cutout?: ElectronPointInput['field'] | undefined;
  readonly depth?: number | undefined;
  readonly isodose?: number | undefined;
  readonly ssd?: number | undefined;
  readonly mu?: number | undefined;
  readonly dose?: number | undefined;
}

/** The electron point dose with every factor; the SSD defaults to the nominal. */
export function electronCalc(machine: MachineModel, o: ElectronCalcRequest): Result<ElectronCalcReport> {
  const found = findElectronBeam(machine, o.energy);
  if (!found.ok) return found;
  const beam = found.value;
  const app = beam.applicators.find((a) => a.id === o.applicator);
  if (!app)
    return refuse([
      {
        severity: 'error',
        code: 'missing-table',
        message: `electron beam ${beam.id} has no applicator "${o.applicator}"`,
        expected: beam.applicators.map((a) => a.id).join(', '),
        found: o.applicator,
      },
    ]);
  const field: ElectronPointInput['field'] = o.cutout ?? { kind: 'equivalent-square', sideCm: app.sideCm, method: 'the open applicator' };
  const depthCm = o.depth ?? electronIsodoseDepthCm(beam, field, o.isodose!);
  if (depthCm === undefined) {
    return refuse([
      {
        severity: 'error',
        code: 'out-of-range',
        message: `the ${o.isodose} % isodose is not reached beyond dmax within ${beam.id}'s PDD table for this cutout`,
        expected: 'an isodose level the PDD passes through beyond dmax',
      },
    ]);
  }
  const input: ElectronPointInput = { applicatorId: app.id, field, depthCm, ssdCm: o.ssd ?? beam.calibration.ssd0Cm };
  const r = electronDosePerMu(beam, input);
  if (!r.ok) return refuse(r.issues);
  const mu = o.mu ?? o.dose! / r.value.dosePerMuCGy;
  const doseCGy = o.dose ?? o.mu! * r.value.dosePerMuCGy;
  const pddPercent = 100 * (r.value.factors.find((f) => f.key === 'PDD')?.value ?? Number.NaN);
  const flags = [...electronDepthFlags(depthCm, electronDmaxCm(beam, field), pddPercent), ...muFlags(machine, mu)];
  return {
    ok: true,
    value: {
      flags,
      machine,
      beam,
      input,
      result: r.value,
      mu,
      doseCGy,
      given: o.mu !== undefined ? 'mu' : 'dose',
      ...(o.isodose !== undefined ? { isodosePercent: o.isodose } : {}),
    },
  };
}
