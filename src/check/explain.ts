import { findPhotonBeam } from '../beamdata/index.js';
import {
  type BeamCheck,
  type CheckedBeam,
  type DoseGrid,
  type DeviationCause,
  type Explanation,
  type MachineModel,
  MM_PER_CM,
  type PhotonBeamModel,
} from '../model/index.js';
import { doseAtPointGy } from '../geometry/index.js';
import { projectFieldCm, tprAt } from '../physics/index.js';

/** Causes smaller than this (percent of dose) are noise, not said. */
const NOISE_PERCENT = 0.1;
/** A typing slip is recognised when the MU ratio matches it within this (relative). */
const SLIP_MATCH = 0.002;

/**
 * Why a beam's independent dose may differ from the planning system's, with numbers: each cause is
 * the dose ratio it alone would make (ours over what ours would be with the planning system's
 * quantity), so causes multiply, and in percent they add up with the residual to the deviation.
 * Physical causes first (the planning system's stated depth and equivalent depth against ours, or
 * the CT's SSD against the plan's); then, for what is left, an MU as typed when the plan's other
 * beams agree. For beams not within tolerance, or every beam on request.
 */
export function explainBeams(beams: readonly BeamCheck[], machine: MachineModel, all = false, grids: readonly DoseGrid[] = []): BeamCheck[] {
  const checked = beams.filter((b): b is CheckedBeam => b.status === 'checked');
  return beams.map((b) => {
    if (b.status !== 'checked' || (b.verdict === 'within tolerance' && !all) || b.calculation.doseDeviationPercent === undefined) return b;
    const others = checked.filter((o) => o !== b && o.calculation.doseDeviationPercent !== undefined && o.verdict === 'within tolerance');
    const grid =
      grids.find((g) => g.summationType === 'BEAM' && g.referencedBeamNumber === b.beamNumber) ?? grids.find((g) => g.summationType !== 'BEAM');
    return { ...b, explanation: explainBeam(b, others, machine, grid) };
  });
}

function explainBeam(b: CheckedBeam, others: readonly CheckedBeam[], machine: MachineModel, grid: DoseGrid | undefined): Explanation {
  const deviationPercent = b.calculation.doseDeviationPercent!;
  const data = b.radiationType === 'PHOTON' && !b.calculation.modulated ? photonData(b, machine) : undefined;
  const f = data ? depthDose(b, data, machine.sadCm) : undefined;
  const physical = f ? [depthCause(b, f), heterogeneityCause(b, f), ssdCause(b, f)] : [];
  const causes = physical.filter((c): c is DeviationCause => !!c && Math.abs(c.contributionPercent) >= NOISE_PERCENT);
  const gradient = grid ? gradientCause(b, grid, residual(deviationPercent, causes)) : undefined;
  if (gradient) causes.push(gradient);
  const leaves = transmissionCause(b, residual(deviationPercent, causes));
  if (leaves) causes.push(leaves);
  const left = residual(deviationPercent, causes);
  const mu = muCause(b, left, others);
  if (mu) causes.push(mu);
  causes.sort((x, y) => Math.abs(y.contributionPercent) - Math.abs(x.contributionPercent));
  const residualPercent = residual(deviationPercent, causes);
  const largest = Math.max(0, ...causes.map((c) => Math.abs(c.contributionPercent)));
  // Said only when what is left matters: beyond noise and beyond every known cause.
  return { deviationPercent, causes, residualPercent, unexplained: Math.abs(residualPercent) > Math.max(largest, 0.5) };
}

/** The shift a point's position may carry between two systems (mm; common practice, no source: a voxel, a rounding of coordinates). */
const SHIFT_MM = 2;

/**
 * The point in a dose gradient, from the planning system's RT Dose: the largest change of its dose
 * for a 2 mm shift along x, y or z. A possible cause, as large as that change at most, and never
 * more than what is left to explain (with its sign).
 */
function gradientCause(b: CheckedBeam, grid: DoseGrid, leftPercent: number): DeviationCause | undefined {
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
  const contribution = Math.sign(leftPercent) * Math.min(change, Math.abs(leftPercent));
  if (Math.abs(contribution) < NOISE_PERCENT) return undefined;
  return {
    code: 'gradient',
    contributionPercent: contribution,
    confidence: 'possible',
    evidence: { percentPerMm: change / SHIFT_MM, changeFor2MmPercent: change, grid: grid.summationType },
  };
}

/** The leaf transmission a planning system may model differently (common practice, no source: ±20 %). */
const TRANSMISSION_SPREAD = 0.2;

/**
 * A modulated beam whose point lies under the leaves for part of its MU: the primary it receives
 * then comes through the leaves, so a leaf transmission 20 % different in the planning system moves
 * that part by 20 %. A possible cause, at most what is left to explain.
 */
function transmissionCause(b: CheckedBeam, leftPercent: number): DeviationCause | undefined {
  const m = b.calculation.modulated;
  const rows = m?.segmentRows;
  if (!rows?.length || !(m!.pointCoveredMuPercent > 0)) return undefined;
  const total = rows.reduce((s, r) => s + r.doseCGy, 0);
  const throughLeaves = rows
    .filter((r) => r.primaryFluence < 1 && r.scatterSpTpr !== undefined && r.spTpr > 0)
    .reduce((s, r) => s + r.doseCGy * (1 - r.scatterSpTpr! / r.spTpr), 0);
  const sensitivity = (100 * TRANSMISSION_SPREAD * throughLeaves) / total;
  const contribution = Math.sign(leftPercent) * Math.min(sensitivity, Math.abs(leftPercent));
  if (!(Math.abs(contribution) >= NOISE_PERCENT)) return undefined;
  return {
    code: 'leaf-transmission',
    contributionPercent: contribution,
    confidence: 'possible',
    evidence: { coveredMuPercent: m!.pointCoveredMuPercent, throughLeavesPercent: (100 * throughLeaves) / total, sensitivityPercent: sensitivity },
  };
}

/** What is left of the deviation once the causes' ratios are divided out (percent). */
function residual(deviationPercent: number, causes: readonly DeviationCause[]): number {
  const explained = causes.reduce((p, c) => p * (1 + c.contributionPercent / 100), 1);
  return 100 * ((1 + deviationPercent / 100) / explained - 1);
}

function photonData(b: CheckedBeam, machine: MachineModel): PhotonBeamModel | undefined {
  if (b.nominalEnergy === undefined) return undefined;
  const found = findPhotonBeam(machine, b.nominalEnergy);
  return found.ok ? found.value : undefined;
}

/**
 * The dose at depth d relative to another depth for this beam's field: TPR at the field's side at
 * that depth, and for an SSD setup (the surface fixed, the point moving) the inverse square as well.
 */
function depthDose(b: CheckedBeam, data: PhotonBeamModel, sadCm: number): (depthCm: number) => number {
  const c = b.calculation;
  return (d) => {
    const side = projectFieldCm(c.irradiatedSquareCm, sadCm, c.ssdCm + d);
    const isf = c.setup === 'SSD' ? 1 / (c.ssdCm + d) ** 2 : 1;
    return tprAt(data, d, side, []) * isf;
  };
}

/** Our depth against the planning system's stated Beam Dose Point Depth (both along the ray to the point). */
function depthCause(b: CheckedBeam, f: (depthCm: number) => number): DeviationCause | undefined {
  const t = b.calculation.planningSystemDepths;
  if (t?.depthMm === undefined || t.depthDifferenceMm === undefined) return undefined;
  const theirsCm = t.depthMm / MM_PER_CM;
  const oursCm = theirsCm + t.depthDifferenceMm / MM_PER_CM;
  const ratio = f(oursCm) / f(theirsCm);
  if (!Number.isFinite(ratio)) return undefined;
  return {
    code: 'depth',
    contributionPercent: 100 * (ratio - 1),
    confidence: 'measured',
    evidence: { oursCm, planningSystemCm: theirsCm, differenceCm: oursCm - theirsCm },
  };
}

/**
 * The heterogeneity correction each side made: the planning system's from its Equivalent Depth
 * beside its depth, ours from the CT's radiological depth (none without the CT).
 */
function heterogeneityCause(b: CheckedBeam, f: (depthCm: number) => number): DeviationCause | undefined {
  const t = b.calculation.planningSystemDepths;
  if (t?.depthMm === undefined || t.equivalentDepthMm === undefined) return undefined;
  const theirs = f(t.equivalentDepthMm / MM_PER_CM) / f(t.depthMm / MM_PER_CM);
  const ct = b.calculation.ct;
  const ours = ct ? ct.correctionFactor : 1;
  const ratio = ours / theirs;
  if (!Number.isFinite(ratio)) return undefined;
  return {
    code: 'heterogeneity',
    contributionPercent: 100 * (ratio - 1),
    confidence: 'measured',
    evidence: {
      planningSystemEquivalentDepthCm: t.equivalentDepthMm / MM_PER_CM,
      planningSystemDepthCm: t.depthMm / MM_PER_CM,
      planningSystemCorrection: theirs,
      ourCorrection: ours,
      ours: ct ? 'the CT' : 'none (no CT)',
    },
  };
}

/** With the CT and no stated depth: the plan's SSD would put the point deeper or shallower than the CT does. */
function ssdCause(b: CheckedBeam, f: (depthCm: number) => number): DeviationCause | undefined {
  const ct = b.calculation.ct;
  if (!ct || ct.ssdDifferenceMm === undefined || b.calculation.planningSystemDepths?.depthMm !== undefined) return undefined;
  const oursCm = b.calculation.depthCm;
  const planCm = oursCm + ct.ssdDifferenceMm / MM_PER_CM;
  const ratio = f(oursCm) / f(planCm);
  if (!Number.isFinite(ratio) || planCm < 0) return undefined;
  return {
    code: 'ssd-ct-vs-plan',
    contributionPercent: 100 * (ratio - 1),
    confidence: 'estimated',
    evidence: {
      ctSsdCm: (ct.ssdAlongAxisMm ?? 0) / MM_PER_CM,
      planSsdCm: (ct.planSsdMm ?? 0) / MM_PER_CM,
      depthCm: oursCm,
      depthByPlanSsdCm: planCm,
    },
  };
}

/**
 * What is left beyond the tolerance, when the plan's other beams agree: the beam's MU as typed?
 * Named as a slip (×10, two digits swapped, a 1 for a 7) when the planned MU matches one.
 */
function muCause(b: CheckedBeam, leftPercent: number, others: readonly CheckedBeam[]): DeviationCause | undefined {
  if (!others.length || Math.abs(leftPercent) <= b.tolerancePercent || b.plannedMu === undefined) return undefined;
  const othersMean = others.reduce((s, o) => s + o.calculation.doseDeviationPercent!, 0) / others.length;
  const ratio = (1 + leftPercent / 100) / (1 + othersMean / 100);
  const intendedMu = b.plannedMu / ratio;
  const slip = typingSlip(b.plannedMu, ratio);
  return {
    code: 'mu-as-typed',
    contributionPercent: 100 * (ratio - 1),
    confidence: slip ? 'estimated' : 'possible',
    evidence: { plannedMu: b.plannedMu, muAtTheOtherBeamsAgreement: intendedMu, othersMeanDeviationPercent: othersMean, ...(slip ? { slip } : {}) },
  };
}

/** A typing slip that turns some intended MU into the planned one with this ratio, if any. */
export function typingSlip(plannedMu: number, ratio: number): string | undefined {
  const near = (intended: number) => intended > 0 && Math.abs(plannedMu / intended / ratio - 1) < SLIP_MATCH;
  if (near(plannedMu / 10)) return 'a digit too many (×10)';
  if (near(plannedMu * 10)) return 'a digit too few (÷10)';
  const text = plannedMu.toFixed(1);
  for (let i = 0; i + 1 < text.length; i++) {
    if (text[i] === '.' || text[i + 1] === '.') continue;
    const swapped = `${text.slice(0, i)}${text[i + 1]}${text[i]}${text.slice(i + 2)}`;
    if (swapped !== text && near(Number(swapped))) return `two digits swapped (${swapped} typed as ${text})`;
  }
  for (const [from, to] of [
    ['7', '1'],
    ['1', '7'],
  ] as const) {
    for (let i = 0; i < text.length; i++) {
      if (text[i] !== from) continue;
      const other = `${text.slice(0, i)}${to}${text.slice(i + 1)}`;
      if (near(Number(other))) return `a ${from} typed for a ${to} (${other} typed as ${text})`;
    }
  }
  return undefined;
}
