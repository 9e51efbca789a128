import type { LookupLog, PhotonBeamModel, TableLookup } from '../model/index.js';
import { scAt, spAt, tprAt } from './beam-factors.js';
import { projectFieldCm } from './inverse-square.js';

/**
 * Sc and Sp for the reference field of the calibration, which must both be 1: a mismatch between
 * how the 10 × 10 reference field is defined (at the surface or at the normalization point) and how
 * the factors were normalized is a silent 0.3–1 % error.
 */
export function referenceFieldFactors(beam: PhotonBeamModel, sadCm: number): { scCm: number; sc: number; spCm: number; sp: number } {
  const c = beam.calibration;
  const log: LookupLog = [];
  // The reference field's side at the normalization point and at the isocenter plane.
  const atD0 = c.referenceFieldAt === 'normalization-depth' ? c.referenceFieldCm : projectFieldCm(c.referenceFieldCm, c.ssd0Cm, c.ssd0Cm + c.d0Cm);
  const atIso = projectFieldCm(atD0, c.ssd0Cm + c.d0Cm, sadCm);
  return { scCm: atIso, sc: scAt(beam, atIso, atIso, log), spCm: atD0, sp: spAt(beam, atD0, log) };
}

export interface PddTprDifference {
  readonly row: number;
  readonly column: number;
  readonly depthCm: number;
  readonly surfaceSideCm: number;
  /** 100 · (TPR from the PDD table − TPR table) / TPR table. */
  readonly differencePercent: number;
}

/**
 * Where both PDD and TPR were measured: every PDD cell at or below dmax converted to TPR (exactly,
 * through Sp) and compared with the TPR table. Cells whose conversion needs values outside the
 * tables are skipped and counted.
 */
export function pddTprAgreement(beam: PhotonBeamModel): { differences: PddTprDifference[]; skipped: number } | undefined {
  if (!beam.pdd || !beam.tpr) return undefined;
  const withoutPdd: PhotonBeamModel = { ...beam };
  delete (withoutPdd as { pdd?: unknown }).pdd;
  const withoutTpr: PhotonBeamModel = { ...beam, sp: spAtD0(beam) };
  for (const k of ['tpr', 'scp', 'spMeasuredAtDepthCm'] as const) delete (withoutTpr as Partial<PhotonBeamModel>)[k];
  const f = beam.pdd.ssdCm;
  const differences: PddTprDifference[] = [];
  let skipped = 0;
  const depths = beam.pdd.rows.values;
  const sides = beam.pdd.columns!.values;
  for (let i = 0; i < depths.length; i++) {
    const d = depths[i]!;
    if (d < beam.calibration.dmaxCm - 1e-9) continue;
    for (let j = 0; j < sides.length; j++) {
      const r = sides[j]!;
      const log: LookupLog = [];
      const rd = projectFieldCm(r, f, f + d);
      const fromPdd = tprAt(withoutTpr, d, rd, log);
      const measured = tprAt(withoutPdd, d, rd, log);
      if (log.some((n) => n.kind === 'out-of-range') || !Number.isFinite(fromPdd) || !Number.isFinite(measured)) {
        skipped++;
        continue;
      }
      differences.push({ row: i, column: j, depthCm: d, surfaceSideCm: r, differencePercent: (100 * (fromPdd - measured)) / measured });
    }
  }
  return { differences, skipped };
}

/** Sp at d0 as a table of its own (converted from its measurement depth through the full beam's TPR), for a beam stripped of its TPR. */
function spAtD0(beam: PhotonBeamModel): TableLookup {
  const rows = (beam.sp ?? beam.scp)!.rows;
  return {
    name: `${beam.id} Sp at d0`,
    rows,
    at: (side, _column, log) => spAt(beam, side, log),
    atRow: (side, log) => () => spAt(beam, side, log),
  };
}
