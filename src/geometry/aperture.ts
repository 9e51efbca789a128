import type { Beam, ControlPoint } from '../model/index.js';
import { type PackedRings, RING_EPS_MM, RingWriter } from './packed-rings.js';

/** An axis-aligned opening band: y in [y0, y1], x in [x0, x1] (empty when x1 <= x0). Isocenter plane, mm. */
interface Band {
  readonly y0: number;
  readonly y1: number;
  readonly x0: number;
  readonly x1: number;
}

/**
 * The opening at the isocenter plane made by the jaws and the MLC leaves (blocks are not part of
 * it: beams with blocks are handled elsewhere). Coordinates in the BEAM LIMITING DEVICE frame; for
 * an MLCY the leaves travel along Y, and the bands are built in swapped axes.
 */
export interface Aperture {
  readonly jawsMm: { readonly x1: number; readonly x2: number; readonly y1: number; readonly y2: number };
  readonly leaves: boolean;
  readonly areaMm2: number;
  readonly perimeterMm: number;
  readonly centroidMm: readonly [number, number];
  /** Bounding box of the open area: the collimating opening along an axis that has no jaws. */
  readonly openExtentMm: { readonly x1: number; readonly x2: number; readonly y1: number; readonly y2: number };
  /** Whether real jaws bound the opening along X and along Y. */
  readonly hasJaws: { readonly x: boolean; readonly y: boolean };
  /** The collimating opening: the jaws, or the leaves' open extent along an axis without jaws. */
  readonly collimatingMm: { readonly x1: number; readonly x2: number; readonly y1: number; readonly y2: number };
  /** Whether (x, y) lies in the opening of jaws and leaves. */
  isOpen(x: number, y: number): boolean;
  /** Signed distance from (x, y) to the nearest edge: positive inside the opening. */
  edgeDistanceMm(x: number, y: number): number;
  /** The width of the opening along the leaves' travel at (x, y): its leaf pair's gap within the jaws, 0 where closed. */
  openWidthMm(x: number, y: number): number;
  /**
   * For n equal sectors around (x, y) (mid-sector directions), the distances along each to where it
   * crosses the outline, in order: leaving the opening, entering it again, …
   */
  sectorCrossingsMm(x: number, y: number, n: number): number[][];
  /**
   * The rings of n equal sectors around (x, y) (mid-sector directions) out to the collimating
   * opening: weight 1 where open, `leafTransmission` under the leaves, 0 outside the opening.
   * Walks the leaf bands the ray crosses instead of testing every edge (see sector-rings.ts).
   */
  sectorRingsMm(x: number, y: number, n: number, leafTransmission: number): PackedRings;
}

/** Lengths below this are no ring (and crossings closer than it are one). */
const EPS_MM = RING_EPS_MM;

const DIRECTIONS = new Map<number, Float64Array>();

/** cos and sin of the mid-sector directions ((i + ½)·2π/n) of n equal sectors, computed once per n. */
export function sectorDirections(n: number): Float64Array {
  let d = DIRECTIONS.get(n);
  if (!d) {
    d = new Float64Array(2 * n);
    for (let i = 0; i < n; i++) {
      const t = ((i + 0.5) * 2 * Math.PI) / n;
      d[2 * i] = Math.cos(t);
      d[2 * i + 1] = Math.sin(t);
    }
    DIRECTIONS.set(n, d);
  }
  return d;
}

/** Reused by every sector walk (one thread, no re-entry). */
const writer = new RingWriter();
const span = new Float64Array(2);

const UNBOUNDED_MM = 1e4;

/**
 * The aperture at a control point, or undefined when the beam has no jaws along an axis and no leaves
 * there. `leafGapMm` (the dosimetric leaf gap) widens each open leaf pair, half at each leaf end,
 * never beyond the jaws; a closed pair (its leaves touching or crossed) stays closed.
 */
export function apertureAt(beam: Beam, cp: ControlPoint, leafGapMm = 0): Aperture | undefined {
  const pos = (t: string) => cp.devices.find((d) => d.type === t)?.positionsMm;
  const xj = pos('ASYMX') ?? pos('X');
  const yj = pos('ASYMY') ?? pos('Y');
  const mlcx = beam.limitingDevices.find((d) => d.type === 'MLCX');
  const mlcy = beam.limitingDevices.find((d) => d.type === 'MLCY');
  // An axis without jaws is bounded by the leaves alone (hasJaws says so).
  const jaws = { x1: xj?.[0] ?? -UNBOUNDED_MM, x2: xj?.[1] ?? UNBOUNDED_MM, y1: yj?.[0] ?? -UNBOUNDED_MM, y2: yj?.[1] ?? UNBOUNDED_MM };
  if (!xj && !mlcx && !mlcy) return undefined;
  if (!yj && !mlcx && !mlcy) return undefined;
  const mlc = mlcx ?? mlcy;
  const leaves = mlc ? pos(mlc.type) : undefined;
  const swapped = mlc?.type === 'MLCY';
  // In the band frame u runs along the leaves' travel, v across them.
  const u1 = swapped ? jaws.y1 : jaws.x1;
  const u2 = swapped ? jaws.y2 : jaws.x2;
  const v1 = swapped ? jaws.x1 : jaws.y1;
  const v2 = swapped ? jaws.x2 : jaws.y2;
  const bands: Band[] = [];
  if (mlc && leaves && mlc.leafBoundariesMm) {
    const n = mlc.numberOfPairs;
    const b = mlc.leafBoundariesMm;
    for (let i = 0; i < n; i++) {
      const y0 = Math.max(b[i]!, v1);
      const y1 = Math.min(b[i + 1]!, v2);
      if (y1 <= y0) continue;
      const [left, right] = [leaves[i]!, leaves[i + n]!];
      const half = right > left ? leafGapMm / 2 : 0;
      bands.push({ y0, y1, x0: Math.max(left - half, u1), x1: Math.min(right + half, u2) });
    }
  } else {
    bands.push({ y0: v1, y1: v2, x0: u1, x1: u2 });
  }
  const toBld = (u: number, v: number): [number, number] => (swapped ? [v, u] : [u, v]);
  let area = 0;
  let cu = 0;
  let cv = 0;
  for (const band of bands) {
    const w = Math.max(0, band.x1 - band.x0);
    const a = w * (band.y1 - band.y0);
    area += a;
    cu += a * ((band.x0 + band.x1) / 2);
    cv += a * ((band.y0 + band.y1) / 2);
  }
  const perimeter = outlineLength(bands);
  const centroid = area > 0 ? toBld(cu / area, cv / area) : toBld(0, 0);
  // A closed leaf pair (x1 <= x0) opens nothing, not even the line where its leaves meet.
  const open = bands.filter((band) => band.x1 > band.x0);
  // The outline's edges, built when first needed (the general sector crossings, for blocked fields;
  // the sector walk and the edge distance do without them). All are along u or along v: kept
  // apart as (position, from, to) triples, a ray's crossing with each is one multiplication.
  let outline: { edgesV: Float64Array; edgesU: Float64Array } | undefined;
  const edges = () => (outline ??= boundary(bands));
  const openBandAt = (u: number, v: number): Band | undefined => {
    let lo = 0;
    let hi = open.length - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      if (open[mid]!.y0 <= v) lo = mid + 1;
      else hi = mid - 1;
    }
    // Bands share their boundary lines: a point on one belongs to either neighbour.
    for (let k = hi; k >= 0 && k >= hi - 1; k--) {
      const b = open[k]!;
      if (v >= b.y0 && v <= b.y1 && u >= b.x0 && u <= b.x1) return b;
    }
    return undefined;
  };
  const inOpen = (u: number, v: number): boolean => openBandAt(u, v) !== undefined;
  // The open bands' extent, and the open bands as flat (v0, v1, u0, u1) for the sector walk.
  let [uMin, uMax, vMin, vMax] = [Infinity, -Infinity, Infinity, -Infinity];
  const openFlat: number[] = [];
  open.forEach((b) => {
    openFlat.push(b.y0, b.y1, b.x0, b.x1);
    uMin = Math.min(uMin, b.x0);
    uMax = Math.max(uMax, b.x1);
    vMin = Math.min(vMin, b.y0);
    vMax = Math.max(vMax, b.y1);
  });
  const extent = !open.length
    ? { x1: 0, x2: 0, y1: 0, y2: 0 }
    : swapped
      ? { x1: vMin, x2: vMax, y1: uMin, y2: uMax }
      : { x1: uMin, x2: uMax, y1: vMin, y2: vMax };
  const box = { x1: xj ? jaws.x1 : extent.x1, x2: xj ? jaws.x2 : extent.x2, y1: yj ? jaws.y1 : extent.y1, y2: yj ? jaws.y2 : extent.y2 };
  return {
    jawsMm: jaws,
    leaves: !!(mlc && leaves),
    areaMm2: area,
    perimeterMm: perimeter,
    centroidMm: centroid,
    openExtentMm: extent,
    hasJaws: { x: !!xj, y: !!yj },
    collimatingMm: box,
    isOpen(x: number, y: number): boolean {
      return swapped ? inOpen(y, x) : inOpen(x, y);
    },
    edgeDistanceMm(x: number, y: number): number {
      const u = swapped ? y : x;
      const v = swapped ? x : y;
      const d = outlineDistance(bands, u, v);
      return inOpen(u, v) ? d : -d;
    },
    openWidthMm(x: number, y: number): number {
      const b = swapped ? openBandAt(y, x) : openBandAt(x, y);
      return b ? b.x1 - b.x0 : 0;
    },
    sectorCrossingsMm(x: number, y: number, n: number): number[][] {
      const [pu, pv] = swapped ? [y, x] : [x, y];
      const { edgesV, edgesU } = edges();
      const dirs = sectorDirections(n);
      const out: number[][] = [];
      for (let i = 0; i < n; i++) {
        // Direction in BLD (x, y), then in the band frame.
        const du = swapped ? dirs[2 * i + 1]! : dirs[2 * i]!;
        const dv = swapped ? dirs[2 * i]! : dirs[2 * i + 1]!;
        const hits: number[] = [];
        // Ray (pu, pv) + s·(du, dv) against each edge: along v (u constant), then along u.
        edgeHits(edgesV, pu, pv, du, dv, hits);
        edgeHits(edgesU, pv, pu, dv, du, hits);
        hits.sort((a, b) => a - b);
        let m = 0;
        for (let k = 0; k < hits.length; k++) if (k === 0 || hits[k]! - hits[m - 1]! > 1e-9) hits[m++] = hits[k]!;
        hits.length = m;
        out.push(hits);
      }
      return out;
    },
    sectorRingsMm(x: number, y: number, n: number, leafTransmission: number): PackedRings {
      const pu = swapped ? y : x;
      const pv = swapped ? x : y;
      const m = openFlat.length / 4;
      const dirs = sectorDirections(n);
      writer.begin(n);
      for (let i = 0; i < n; i++) {
        const dx = dirs[2 * i]!;
        const dy = dirs[2 * i + 1]!;
        spanInside(box, x, y, dx, dy, span);
        const enter = span[0]!;
        const exit = span[1]!;
        if (enter >= exit) {
          writer.push(exit, 0);
          writer.endSector();
          continue;
        }
        writer.push(enter, 0);
        // The open stretches of the ray, band by band outward from the point (bands are in v order);
        // inline slab arithmetic: this loop runs for every sector of every segment of an arc.
        const du = swapped ? dy : dx;
        const dv = swapped ? dx : dy;
        const iu = 1 / du;
        const iv = 1 / dv;
        const step = dv > 0 ? 1 : dv < 0 ? -1 : 0;
        let reached = enter; // how far the rings go
        for (
          let k = step > 0 ? firstBandFrom(openFlat, pv, false) : step < 0 ? firstBandFrom(openFlat, pv, true) : 0;
          k >= 0 && k < m;
          k += step || 1
        ) {
          const o = 4 * k;
          let a: number;
          let b: number;
          if (step === 0) {
            if (pv < openFlat[o]! || pv > openFlat[o + 1]!) continue;
            a = -Infinity;
            b = Infinity;
          } else {
            const a0 = (openFlat[o]! - pv) * iv;
            const b0 = (openFlat[o + 1]! - pv) * iv;
            a = a0 < b0 ? a0 : b0;
            b = a0 < b0 ? b0 : a0;
            if (a > exit) break; // this band and those beyond start past the exit
          }
          let c: number;
          let d: number;
          if (du === 0) {
            if (pu < openFlat[o + 2]! || pu > openFlat[o + 3]!) continue;
            c = -Infinity;
            d = Infinity;
          } else {
            const c0 = (openFlat[o + 2]! - pu) * iu;
            const d0 = (openFlat[o + 3]! - pu) * iu;
            c = c0 < d0 ? c0 : d0;
            d = c0 < d0 ? d0 : c0;
          }
          const from = Math.max(a, c, enter);
          const to = Math.min(b, d, exit);
          if (to - from < EPS_MM || to <= reached) continue;
          if (from - reached >= EPS_MM) writer.push(from, leafTransmission);
          writer.push(to, 1);
          reached = to;
        }
        writer.push(exit, leafTransmission);
        writer.endSector();
      }
      return writer.finish();
    },
  };
}

/**
 * Adds to `hits` the distances s > 0 at which p + s·dp reaches each edge's position while q + s·dq
 * lies within the edge's extent; edges are flat (position, from, to) triples. No allocation.
 */
function edgeHits(edges: Float64Array, p: number, q: number, dp: number, dq: number, hits: number[]): void {
  if (Math.abs(dp) <= 1e-12) return;
  const inv = 1 / dp;
  for (let k = 0; k < edges.length; k += 3) {
    const h = (edges[k]! - p) * inv;
    if (h <= 1e-9) continue;
    const at = q + h * dq;
    if (at >= edges[k + 1]! && at <= edges[k + 2]!) hits.push(h);
  }
}

/**
 * Where the ray (x, y) + s·(dx, dy), s ≥ 0, lies inside a rectangle: out[0] = enter, out[1] = exit
 * (slabs; enter ≥ exit when it misses). Written into `out`: it runs for every sector of every segment.
 */
export function spanInside(
  box: { readonly x1: number; readonly x2: number; readonly y1: number; readonly y2: number },
  x: number,
  y: number,
  dx: number,
  dy: number,
  out: Float64Array,
): Float64Array {
  let enter = 0;
  let exit = Infinity;
  // Along each axis: all s when the ray runs parallel inside the slab, none when outside it.
  if (dx === 0) {
    if (x < box.x1 || x > box.x2) [enter, exit] = [Infinity, -Infinity];
  } else {
    const a = (box.x1 - x) / dx;
    const b = (box.x2 - x) / dx;
    enter = Math.max(enter, a < b ? a : b);
    exit = Math.min(exit, a < b ? b : a);
  }
  if (dy === 0) {
    if (y < box.y1 || y > box.y2) [enter, exit] = [Infinity, -Infinity];
  } else {
    const a = (box.y1 - y) / dy;
    const b = (box.y2 - y) / dy;
    enter = Math.max(enter, a < b ? a : b);
    exit = Math.min(exit, a < b ? b : a);
  }
  out[0] = enter;
  out[1] = Math.max(0, exit);
  return out;
}

/**
 * The first band a ray from v meets going up (bands ending at or above v, lowest first) or down
 * (bands starting at or below v, highest first): a binary search over bands in v order.
 */
function firstBandFrom(flat: readonly number[], v: number, down: boolean): number {
  const m = flat.length / 4;
  let lo = 0;
  let hi = m;
  if (!down) {
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (flat[4 * mid + 1]! < v) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  }
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (flat[4 * mid]! <= v) lo = mid + 1;
    else hi = mid;
  }
  return lo - 1;
}

/** Receives the outline's edges: along v (at u = p, from v = a to b) or along u (at v = p, from u = a to b), a < b. */
interface OutlineVisitor {
  alongV(p: number, a: number, b: number): void;
  alongU(p: number, a: number, b: number): void;
}

/**
 * The outline of a stack of bands: each open band's two ends, and between neighbouring bands the
 * parts of the shared boundary covered by one band only (the symmetric difference of their openings).
 * Every edge runs along v or along u; the visitor gets each as (position, from, to), so the length,
 * the edges and a point's distance to them come from this one walk without edge objects.
 */
function visitOutline(bands: readonly Band[], to: OutlineVisitor): void {
  const open = (b: Band | undefined) => (b && b.x1 > b.x0 ? b : undefined);
  for (const b of bands) {
    if (!open(b)) continue;
    to.alongV(b.x0, b.y0, b.y1);
    to.alongV(b.x1, b.y0, b.y1);
  }
  for (let i = -1; i < bands.length; i++) {
    const lower = open(bands[i]);
    const upper = open(bands[i + 1]);
    // Bands are contiguous only when they share the boundary line.
    if (lower && upper && Math.abs(lower.y1 - upper.y0) < 1e-9) {
      const lo = Math.max(lower.x0, upper.x0);
      const hi = Math.min(lower.x1, upper.x1);
      if (hi <= lo) {
        to.alongU(lower.y1, lower.x0, lower.x1);
        to.alongU(lower.y1, upper.x0, upper.x1);
      } else {
        if (lower.x0 !== upper.x0) to.alongU(lower.y1, Math.min(lower.x0, upper.x0), lo);
        if (lower.x1 !== upper.x1) to.alongU(lower.y1, hi, Math.max(lower.x1, upper.x1));
      }
    } else {
      if (lower) to.alongU(lower.y1, lower.x0, lower.x1);
      if (upper) to.alongU(upper.y0, upper.x0, upper.x1);
    }
  }
}

/** The outline's edges as flat (position, from, to) triples, along v and along u. */
function boundary(bands: readonly Band[]): { edgesV: Float64Array; edgesU: Float64Array } {
  const alongV: number[] = [];
  const alongU: number[] = [];
  visitOutline(bands, { alongV: (p, a, b) => alongV.push(p, a, b), alongU: (p, a, b) => alongU.push(p, a, b) });
  return { edgesV: Float64Array.from(alongV), edgesU: Float64Array.from(alongU) };
}

/** The length of the outline. */
function outlineLength(bands: readonly Band[]): number {
  let length = 0;
  visitOutline(bands, { alongV: (_p, a, b) => (length += b - a), alongU: (_p, a, b) => (length += b - a) });
  return length;
}

/** The distance from (u, v) to the nearest edge of the outline. */
function outlineDistance(bands: readonly Band[], u: number, v: number): number {
  let best = Infinity;
  // An edge at position p across, from a to b along: the point is `across` from its line and `along` on it.
  const consider = (across: number, along: number, a: number, b: number) => {
    const beyond = along < a ? a - along : along > b ? along - b : 0;
    best = Math.min(best, across * across + beyond * beyond);
  };
  visitOutline(bands, { alongV: (p, a, b) => consider(u - p, v, a, b), alongU: (p, a, b) => consider(v - p, u, a, b) });
  return Math.sqrt(best);
}
