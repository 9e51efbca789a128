import { type Aperture, sectorDirections, spanInside } from './aperture.js';
import { type PackedRings, RingWriter } from './packed-rings.js';
import { insidePolygon, polygonEdgeDistance, polygonRayCrossings, type Polygon } from './polygon.js';

/** Reused by the general form (one thread, no re-entry). */
const writer = new RingWriter();

export interface BlockOutline {
  readonly kind: 'APERTURE' | 'SHIELDING';
  readonly outlineMm: Polygon;
  readonly transmission: number;
}

/**
 * The rings of each of n sectors around (x, y). Jaws and leaves alone: the aperture walks its leaf
 * bands (`sectorRingsMm`). With blocks: every place the sector crosses an edge (of the jaws, the
 * leaves or a block) starts a new ring, and each ring is weighed by what covers its middle, which
 * handles any outline the three make together, re-entrant or not.
 */
export function sectorRings(
  aperture: Aperture,
  blocks: readonly BlockOutline[],
  x: number,
  y: number,
  n: number,
  leafTransmission: number,
): PackedRings {
  if (blocks.length === 0) return aperture.sectorRingsMm(x, y, n, leafTransmission);
  return crossingRings(aperture, blocks, x, y, n, leafTransmission);
}

/** The general form (any blocks), by the crossings of each sector with every edge; exported for the tests. */
export function crossingRings(
  aperture: Aperture,
  blocks: readonly BlockOutline[],
  x: number,
  y: number,
  n: number,
  leafTransmission: number,
): PackedRings {
  // Along an axis without jaws the leaves' open extent bounds the field (no transmission beyond it).
  const j = aperture.collimatingMm;
  const inJaws = (px: number, py: number) => px >= j.x1 && px <= j.x2 && py >= j.y1 && py <= j.y2;
  const weightAt = (px: number, py: number): number => {
    if (!inJaws(px, py)) return 0;
    let w = aperture.isOpen(px, py) ? 1 : leafTransmission;
    for (const b of blocks) {
      const inside = insidePolygon(b.outlineMm, px, py);
      if ((b.kind === 'APERTURE' && !inside) || (b.kind === 'SHIELDING' && inside)) w = Math.min(w, b.transmission);
    }
    return w;
  };
  const crossings = aperture.sectorCrossingsMm(x, y, n);
  const dirs = sectorDirections(n);
  const span = new Float64Array(2);
  writer.begin(n);
  crossings.forEach((apertureCuts, i) => {
    const dx = dirs[2 * i]!;
    const dy = dirs[2 * i + 1]!;
    // The aperture's and the blocks' crossings, and where the ray enters the collimating opening
    // (a point outside it), each start a ring; the opening's far side ends the last.
    spanInside(j, x, y, dx, dy, span);
    const enter = span[0]!;
    const jawExit = span[1]!;
    const all = [...apertureCuts, ...blocks.flatMap((b) => polygonRayCrossings(b.outlineMm, x, y, dx, dy)), ...(enter > 0 ? [enter] : [])].sort(
      (a, b) => a - b,
    );
    const cuts = all.filter((c) => c > 1e-9 && c < jawExit);
    let from = 0;
    for (const to of [...cuts, jawExit]) {
      if (to - from < 1e-9) continue;
      const mid = (from + to) / 2;
      writer.push(to, weightAt(x + mid * dx, y + mid * dy));
      from = to;
    }
    writer.endSector();
  });
  return writer.finish();
}

/** Whether the point itself is open (not under a leaf, a jaw or a block). */
export function pointIsOpen(aperture: Aperture, blocks: readonly BlockOutline[], x: number, y: number): boolean {
  return aperture.isOpen(x, y) && blocks.every((b) => (b.kind === 'APERTURE') === insidePolygon(b.outlineMm, x, y));
}

/** Signed distance to the nearest field edge of jaws, leaves and blocks together: positive inside the open field. */
export function fieldEdgeDistanceMm(aperture: Aperture, blocks: readonly BlockOutline[], x: number, y: number): number {
  const d = Math.min(Math.abs(aperture.edgeDistanceMm(x, y)), ...blocks.map((b) => polygonEdgeDistance(b.outlineMm, x, y)));
  return pointIsOpen(aperture, blocks, x, y) ? d : -d;
}
