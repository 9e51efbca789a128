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

/**
 * The primary dose of a Clarkson sum rests on TPR and Sp extrapolated to zero field from the smallest
 * field measured: it matters where the field at the point is smaller than that field, or the point
 * lies under the leaves for part of the MU. Named, not estimated (the extrapolation is the only
 * value plumbline has there).
 */
export function zeroFieldCause(b: CheckedBeam, data: PhotonBeamModel | undefined): DeviationCause | undefined {
  const c = b.calculation;
  const clarkson = c.factors.some((f) => f.key === 'SpTPR') || (c.modulated?.clarksonMuPercent ?? 0) > 0;
  const smallestCm = data?.tpr?.columns?.values[0] ?? data?.sp?.rows.values[0] ?? data?.scp?.rows.values[0];
  if (!clarkson || smallestCm === undefined) return undefined;
  const covered = c.modulated?.pointCoveredMuPercent ?? 0;
  if (!(c.irradiatedSquareCm < smallestCm) && !(covered > 0)) return undefined;
  return {
    code: 'zero-field',
    contributionPercent: 0,
    estimated: false,
    confidence: 'possible',
    evidence: { smallestFieldCm: smallestCm, irradiatedSquareCm: c.irradiatedSquareCm, coveredMuPercent: covered },
  };
}
