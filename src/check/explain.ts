import type { BeamCheck, CheckedBeam, DeviationCause, DoseGrid, Explanation, MachineModel, PhotonBeamModel } from '../model/index.js';
import { photonDataOf, tableEdgeCause, zeroFieldCause } from './causes/beam-data.js';
import { depthCause, depthDose, heterogeneityCause, ssdCause, statedHeterogeneityCause } from './causes/depth.js';
import { fieldEdgeCause, gradientCause } from './causes/gradient.js';
import { LEAF_END_SPREAD_MM, leafEndCause, transmissionCause } from './causes/modulation.js';
import { muCause } from './causes/mu-as-typed.js';
import { extendedSsdCause, machineAliasCause } from './causes/setup.js';
import { NOISE_PERCENT, residual, shareLeft } from './causes/shared.js';

export { typingSlip } from './causes/mu-as-typed.js';

/** Our dose again for one beam with the beam data edited (a sensitivity), or undefined when it cannot be had. */
export type Recheck = (beamNumber: number, machine: MachineModel) => number | undefined;

export interface ExplainOptions {
  readonly machine: MachineModel;
  /** Explain every beam, not only those outside tolerance. */
  readonly all: boolean;
  readonly grids: readonly DoseGrid[];
  /** The policy's large-SSD limit, cm. */
  readonly largeSsdCm: number;
  /** How the plan's machine was matched to the beam data. */
  readonly machineMatch?: { readonly planName: string; readonly via: string } | undefined;
  readonly recheck?: Recheck | undefined;
  /** Whether the planning system's dose is heterogeneity corrected, as its RT Dose or plan states (undefined: not known). */
  readonly planningSystemCorrected?: boolean | undefined;
}

/**
 * Why a beam's independent dose may differ from the planning system's, with numbers: each cause is
 * the dose ratio it alone would make (ours over what ours would be with the planning system's
 * quantity), so causes multiply, and in percent they add up with the residual to the deviation.
 * Measured causes first (the planning system's stated depth and equivalent depth against ours, or
 * the CT's SSD against the plan's); then sensitivities for what is left (a dose gradient, the
 * leaves, an extended SSD); then an MU as typed when the plan's other beams agree; then causes
 * named without a share (a machine alias, a table's edge). For beams not within tolerance, or
 * every beam on request (`force` names beams to explain whatever their verdict).
 */
export function explainBeams(beams: readonly BeamCheck[], o: ExplainOptions, force: ReadonlySet<number> = new Set()): BeamCheck[] {
  const checked = beams.filter((b): b is CheckedBeam => b.status === 'checked');
  return beams.map((b) => {
    if (b.status !== 'checked' || b.calculation.doseDeviationPercent === undefined) return b;
    if (b.verdict === 'within tolerance' && !o.all && !force.has(b.beamNumber)) return b;
    const others = checked.filter((x) => x !== b && x.calculation.doseDeviationPercent !== undefined && x.verdict === 'within tolerance');
    return { ...b, explanation: explainBeam(b, others, o) };
  });
}

function explainBeam(b: CheckedBeam, others: readonly CheckedBeam[], o: ExplainOptions): Explanation {
  const deviationPercent = b.calculation.doseDeviationPercent!;
  const data = photonDataOf(b, o.machine);
  const causes = measuredCauses(b, data, o.machine.sadCm);
  const stated = statedHeterogeneityCause(b, o.planningSystemCorrected);
  if (stated && (stated.estimated === false || Math.abs(stated.contributionPercent) >= NOISE_PERCENT)) causes.push(stated);
  const left = () => residual(deviationPercent, causes);
  const add = (c: DeviationCause | undefined) => {
    if (c) causes.push(c);
  };
  // A recognised typing slip is evidence enough to come before the sensitivities; an MU that merely
  // disagrees with the other beams takes what the sensitivities leave.
  const slip = muCause(b, left(), others);
  if (slip?.evidence.slip) add(slip);
  const grid = gridFor(b, o.grids);
  const possible = [
    grid ? gradientCause(b, grid) : fieldEdgeCause(b, data),
    transmissionCause(b),
    data && hasLeaves(b) ? leafEndCause(b, data.dosimetricLeafGapMm ?? 0, leafEndSensitivity(b, data, o)) : undefined,
    extendedSsdCause(b, data, o.largeSsdCm, o.machine.sadCm),
  ].filter((c): c is DeviationCause => !!c);
  causes.push(
    ...possible.filter((c) => c.estimated === false),
    ...shareLeft(
      possible.filter((c) => c.estimated !== false),
      left(),
    ),
  );
  if (!slip?.evidence.slip) add(muCause(b, left(), others));
  // Causes named without a share: only while what is left is beyond the tolerance.
  if (Math.abs(left()) <= b.tolerancePercent) causes.splice(0, causes.length, ...causes.filter((c) => c.estimated !== false));
  else {
    add(machineAliasCause(o.machineMatch?.via, o.machineMatch?.planName, o.machine.name));
    add(tableEdgeCause(b));
    add(zeroFieldCause(b, data));
  }
  causes.sort((x, y) => Math.abs(y.contributionPercent) - Math.abs(x.contributionPercent));
  return summarised(deviationPercent, causes);
}

/** The causes and the residual; "unexplained" when what is left matters: beyond noise and beyond every known cause. */
export function summarised(deviationPercent: number, causes: DeviationCause[]): Explanation {
  const residualPercent = residual(deviationPercent, causes);
  const largest = Math.max(0, ...causes.map((c) => Math.abs(c.contributionPercent)));
  return { deviationPercent, causes, residualPercent, unexplained: Math.abs(residualPercent) > Math.max(largest, 0.5) };
}

/** The planning system's stated depths against ours (static photon beams, whose dose follows one depth). */
function measuredCauses(b: CheckedBeam, data: PhotonBeamModel | undefined, sadCm: number): DeviationCause[] {
  if (!data || b.calculation.modulated) return [];
  const f = depthDose(b, data, sadCm);
  return [depthCause(b, f), heterogeneityCause(b, f), ssdCause(b, f)].filter(
    (c): c is DeviationCause => !!c && Math.abs(c.contributionPercent) >= NOISE_PERCENT,
  );
}

/** The beam's own RT Dose grid, else the plan's. */
function gridFor(b: CheckedBeam, grids: readonly DoseGrid[]): DoseGrid | undefined {
  return grids.find((g) => g.summationType === 'BEAM' && g.referencedBeamNumber === b.beamNumber) ?? grids.find((g) => g.summationType !== 'BEAM');
}

/** Whether leaves shaped the beam (its result says how their ends were modelled). */
const hasLeaves = (b: CheckedBeam) => b.calculation.approximations.some((n) => n.code === 'leaf-end-gap' || n.code === 'leaf-ends-not-modelled');

/** Our dose with the leaf-end offset 0.5 mm wider, against our dose (percent): one recalculation of this beam. */
function leafEndSensitivity(b: CheckedBeam, data: PhotonBeamModel, o: ExplainOptions): number | undefined {
  if (!o.recheck) return undefined;
  const wider = { ...data, dosimetricLeafGapMm: (data.dosimetricLeafGapMm ?? 0) + LEAF_END_SPREAD_MM };
  const dose = o.recheck(b.beamNumber, { ...o.machine, beams: o.machine.beams.map((x) => (x === data ? wider : x)) });
  return dose === undefined ? undefined : 100 * (dose / b.calculation.independentDoseCGy - 1);
}
