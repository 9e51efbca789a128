import type { CheckedBeam, DeviationCause } from '../../model/index.js';
import { sensitivity } from './shared.js';

/** The leaf transmission a planning system may model differently (common practice, no source: ±20 %). */
export const TRANSMISSION_SPREAD = 0.2;
/** The leaf-end offset (dosimetric leaf gap) a planning system may model differently (common practice, no source: ±0.5 mm). */
export const LEAF_END_SPREAD_MM = 0.5;
/** Segments narrower than this at the point (cm at the isocenter plane) make the dose sensitive to the leaf ends (common practice, no source). */
export const NARROW_SEGMENT_CM = 2;

/**
 * A modulated beam whose point lies under the leaves for part of its MU: the primary it receives
 * then comes through the leaves, so a leaf transmission 20 % different in the planning system moves
 * that part by 20 %. A possible cause carrying that as its sensitivity.
 */
export function transmissionCause(b: CheckedBeam): DeviationCause | undefined {
  const m = b.calculation.modulated;
  const rows = m?.segmentRows;
  if (!rows?.length || !(m!.pointCoveredMuPercent > 0)) return undefined;
  const total = rows.reduce((s, r) => s + r.doseCGy, 0);
  const throughLeaves = rows
    .filter((r) => r.primaryFluence < 1 && r.scatterSpTpr !== undefined && r.spTpr > 0)
    .reduce((s, r) => s + r.doseCGy * (1 - r.scatterSpTpr! / r.spTpr), 0);
  const moved = (100 * TRANSMISSION_SPREAD * throughLeaves) / total;
  const contribution = sensitivity(moved);
  if (contribution === undefined) return undefined;
  return {
    code: 'leaf-transmission',
    contributionPercent: contribution,
    confidence: 'possible',
    evidence: { coveredMuPercent: m!.pointCoveredMuPercent, throughLeavesPercent: (100 * throughLeaves) / total, sensitivityPercent: moved },
  };
}

/** Share of a modulated beam's MU given through openings narrower than 2 cm at the point (percent; undefined for older results). */
export function narrowMuPercent(b: CheckedBeam): number | undefined {
  const rows = b.calculation.modulated?.segmentRows;
  if (!rows?.length || rows.some((r) => r.openWidthCm === undefined)) return undefined;
  const narrow = rows.filter((r) => r.openWidthCm! > 0 && r.openWidthCm! < NARROW_SEGMENT_CM).reduce((s, r) => s + r.muShare, 0);
  return (100 * narrow) / rows.reduce((s, r) => s + r.muShare, 0);
}

/**
 * The leaf ends: our dose again with the leaf-end offset 0.5 mm wider (`changedPercent`, from a
 * recalculation); a planning system modelling them 0.5 mm apart from us moves the dose that much.
 * A possible cause carrying that as its sensitivity; the share of MU through narrow openings said
 * beside it, since that is where the leaf ends matter.
 */
export function leafEndCause(b: CheckedBeam, gapMm: number, changedPercent: number | undefined): DeviationCause | undefined {
  if (changedPercent === undefined) return undefined;
  const contribution = sensitivity(changedPercent);
  if (contribution === undefined) return undefined;
  const narrow = narrowMuPercent(b);
  return {
    code: 'leaf-end-offset',
    contributionPercent: contribution,
    confidence: 'possible',
    evidence: {
      gapMm,
      spreadMm: LEAF_END_SPREAD_MM,
      sensitivityPercent: Math.abs(changedPercent),
      ...(narrow !== undefined ? { narrowMuPercent: narrow } : {}),
    },
  };
}
