import type { CheckedBeam, DeviationCause, MachineModel, PhotonBeamModel } from '../../model/index.js';

/** The photon beam data a checked beam was calculated with (named in its result), if any. */
export function photonDataOf(b: CheckedBeam, machine: MachineModel): PhotonBeamModel | undefined {
  if (b.radiationType !== 'PHOTON') return undefined;
  return machine.beams.find((x) => `${machine.name} ${x.id}` === b.calculation.machineBeam);
}

/**
 * A lookup clamped at a table's edge: the value used is the edge's, not the requested one's, so
 * the dose rests on data the clinic did not measure there. Named (the first clamp and how many),
 * not estimated: plumbline does not extrapolate beam data.
 */
export function tableEdgeCause(b: CheckedBeam): DeviationCause | undefined {
  const clamps = b.calculation.clamps;
  const first = clamps[0];
  if (!first) return undefined;
  return {
    code: 'table-edge',
    contributionPercent: 0,
    estimated: false,
    confidence: 'possible',
    evidence: { table: first.table, axis: first.axis, requested: first.requested, used: first.used, unit: first.unit, clamps: clamps.length },
  };
}
