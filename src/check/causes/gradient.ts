import { doseAtPointGy } from '../../geometry/index.js';
import type { CheckedBeam, DeviationCause, DoseGrid, PhotonBeamModel } from '../../model/index.js';
import { MM_PER_CM } from '../../model/index.js';
import { sensitivity } from './shared.js';

/** The shift a point's position may carry between two systems (mm; common practice, no source: a voxel, a rounding of coordinates). */
export const SHIFT_MM = 2;

/**
 * The point in a dose gradient, from the planning system's RT Dose: the largest change of its dose
 * for a 2 mm shift along x, y or z. A possible cause carrying that change as its sensitivity.
 */
export function gradientCause(b: CheckedBeam, grid: DoseGrid): DeviationCause | undefined {
  const p = b.point.patientMm;
  const here = doseAtPointGy(grid, p);
  if (here === undefined || !(here > 0)) return undefined;
  let change = 0;
  for (let axis = 0; axis < 3; axis++)
    for (const s of [-SHIFT_MM, SHIFT_MM]) {
      const q = [p[0], p[1], p[2]] as [number, number, number];
      q[axis] = q[axis]! + s;
      const there = doseAtPointGy(grid, q);
      if (there !== undefined) change = Math.max(change, Math.abs(100 * (there / here - 1)));
    }
  const contribution = sensitivity(change);
  if (contribution === undefined) return undefined;
  return {
    code: 'gradient',
    contributionPercent: contribution,
    confidence: 'possible',
    evidence: { percentPerMm: change / SHIFT_MM, changeFor2MmPercent: change, grid: grid.summationType },
  };
}

/**
 * The 80–20 % penumbra of a megavoltage photon field at depth assumed for the edge's slope (mm;
 * from memory, typical of 6–18 MV at 5–15 cm; the beam data do not carry it).
 */
export const PENUMBRA_80_20_MM = 6;
/** A blurred edge Φ(x/σ) rises from 20 to 80 % over 2 × 0.8416 σ. */
const SIGMA_PER_80_20 = 1 / (2 * 0.8416);

/**
 * Without the planning system's dose grid: the point near a field edge, or on a sloping off-axis
 * profile. The edge as a step blurred by a Gaussian (the penumbra above), the profile by the beam
 * data's off-axis ratio; the largest change for a 2 mm shift toward or away from the edge, or
 * along the profile, is the sensitivity. Static photon beams only (a modulated beam's edges move).
 */
export function fieldEdgeCause(b: CheckedBeam, data: PhotonBeamModel | undefined): DeviationCause | undefined {
  if (b.radiationType !== 'PHOTON' || b.calculation.modulated) return undefined;
  const edgeMm = b.fitness.edgeDistanceCm * MM_PER_CM;
  const sigma = PENUMBRA_80_20_MM * SIGMA_PER_80_20;
  const at = (x: number) => normalCdf(x / sigma);
  const edge = Math.max(...[-SHIFT_MM, SHIFT_MM].map((s) => Math.abs(100 * (at(edgeMm + s) / at(edgeMm) - 1))));
  const profile = oarSlopePercent(b, data);
  const change = Math.max(edge, profile ?? 0);
  const contribution = sensitivity(change);
  if (contribution === undefined) return undefined;
  return {
    code: 'field-edge',
    contributionPercent: contribution,
    confidence: 'possible',
    evidence: {
      edgeDistanceCm: b.fitness.edgeDistanceCm,
      edgeChangeFor2MmPercent: edge,
      ...(profile !== undefined ? { profileChangeFor2MmPercent: profile } : {}),
      penumbraMm: PENUMBRA_80_20_MM,
    },
  };
}

/** The off-axis ratio's change for a 2 mm shift along the profile at the point, percent. */
function oarSlopePercent(b: CheckedBeam, data: PhotonBeamModel | undefined): number | undefined {
  const f = b.calculation.factors.find((x) => x.key === 'OAR');
  if (!data?.oar || !f || f.args.length < 2) return undefined;
  const [d, x] = f.args as [number, number];
  const here = data.oar.at(d, x, []);
  const step = SHIFT_MM / MM_PER_CM;
  const near = [Math.max(0, x - step), x + step].map((y) => Math.abs(100 * (data.oar!.at(d, y, []) / here - 1)));
  return Math.max(...near);
}

/** The standard normal distribution function, by erf (Abramowitz and Stegun 7.1.26, error below 1.5e-7). */
export function normalCdf(z: number): number {
  const x = Math.abs(z) / Math.SQRT2;
  const t = 1 / (1 + 0.3275911 * x);
  const poly = t * (0.254829592 + t * (-0.284496736 + t * (1.421413741 + t * (-1.453152027 + t * 1.061405429))));
  const erf = 1 - poly * Math.exp(-x * x);
  return z >= 0 ? (1 + erf) / 2 : (1 - erf) / 2;
}
