import type { ClarksonRings, ClarksonSector, LookupLog, PhotonBeamModel } from '../model/index.js';
import { spAt, tprAtDepth } from './beam-factors.js';
import { equivalentSquareOfCircleCm } from './equivalent-square.js';

export interface ClarksonResult {
  /** Sp·TPR for the irregular field at the point: Sp(0)·[TPR(d, 0) + mean SPR(d, r_i)]. */
  readonly spTpr: number;
  readonly sp0: number;
  readonly tpr0: number;
  readonly meanSpr: number;
  readonly sectors: number;
}

/**
 * Clarkson sector integration (Clarkson 1941; Cunningham's scatter method), TPR form:
 *   Sp(r)·TPR(d, r) = Sp(0)·[TPR(d, 0) + SPR(d, r)]
 * The sectors' radii from the point to the field edge (at the point's depth) are turned into the
 * equal-area squares of circles, SPR is averaged over the sectors, and the zero-field values are
 * extrapolated linearly from the two smallest fields of the tables. `primaryWeight` is the fluence at
 * the point itself (1 open; the leaf transmission when a segment of a modulated beam covers it).
 * Returns NaN (with notes) when a table refuses a lookup.
 */
export function clarksonSpTpr(
  beam: PhotonBeamModel,
  depthCm: number,
  sectorRadiiCm: readonly (number | readonly number[] | ClarksonSector)[] | ClarksonRings,
  log: LookupLog,
  leafTransmission = 0,
  primaryWeight = 1,
): ClarksonResult {
  const [s1, s2] = smallestSides(beam);
  const extrapolate = (f: (s: number) => number) => {
    const a = f(s1);
    const b = f(s2);
    return a - (s1 * (b - a)) / (s2 - s1);
  };
  const sp0 = extrapolate((s) => spAt(beam, s, log));
  const tprHere = tprAtDepth(beam, depthCm, log);
  const tpr0 = extrapolate((s) => tprHere(s, log));
  const spr = (side: number) => (spAt(beam, side, log) * tprHere(side, log)) / sp0 - tpr0;
  const spr1 = spr(s1);
  // Below the smallest measured field, SPR falls linearly to 0 at zero field.
  const sprOfRadius = (r: number) => {
    const side = equivalentSquareOfCircleCm(r);
    return side < s1 ? (spr1 * side) / s1 : spr(side);
  };
  let sum = 0;
  let sectors: number;
  if (isPacked(sectorRadiiCm)) {
    // Scatter-sum form: each ring [a, b) of a sector adds weight × (SPR(b) − SPR(a)), weight 1 where
    // open, the leaf or block transmission where they cover it inside the jaws, 0 beyond the jaws.
    const { start, outerCm, weight } = sectorRadiiCm;
    sectors = start.length - 1;
    for (let i = 0; i < sectors; i++) {
      let before = 0;
      for (let k = start[i]!; k < start[i + 1]!; k++) {
        const value = sprOfRadius(outerCm[k]!);
        sum += weight[k]! * (value - before);
        before = value;
      }
    }
  } else {
    sectors = sectorRadiiCm.length;
    for (const sector of sectorRadiiCm) {
      // Crossings: open and under the leaves in turn out to the jaws (the same scatter sum).
      const s =
        typeof sector === 'number'
          ? { crossingsCm: [sector] }
          : Array.isArray(sector)
            ? { crossingsCm: sector as readonly number[] }
            : (sector as ClarksonSector);
      const limit = s.jawLimitCm ?? s.crossingsCm[s.crossingsCm.length - 1] ?? 0;
      let previous = 0;
      let open = true;
      for (const r of [...s.crossingsCm.filter((c) => c < limit), limit]) {
        const value = sprOfRadius(r);
        sum += (open ? 1 : leafTransmission) * (value - previous);
        previous = value;
        open = !open;
      }
    }
  }
  const meanSpr = sectors ? sum / sectors : 0;
  // The primary reaching the point is weighed by what covers the point itself (1 when open).
  return { spTpr: sp0 * (primaryWeight * tpr0 + meanSpr), sp0, tpr0, meanSpr, sectors };
}

function isPacked(s: readonly unknown[] | ClarksonRings): s is ClarksonRings {
  return !Array.isArray(s);
}

const SMALLEST = new WeakMap<PhotonBeamModel, readonly [number, number]>();

/** The two smallest field sides that both the Sp (or Scp) table and the depth-dose table cover (once per beam model). */
function smallestSides(beam: PhotonBeamModel): readonly [number, number] {
  const known = SMALLEST.get(beam);
  if (known) return known;
  const sp = (beam.sp ?? beam.scp)!.rows.values;
  const dd = (beam.tpr ?? beam.pdd)!.columns!.values;
  const common = [...sp].filter((s) => s >= dd[0]! - 1e-9).sort((a, b) => a - b);
  const sides = [common[0] ?? sp[0]!, common[1] ?? sp[1]!] as const;
  SMALLEST.set(beam, sides);
  return sides;
}
