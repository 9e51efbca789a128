import type { CtVolume, Structure } from '../model/index.js';
import { type Vec3, dot, norm, sub } from './vector.js';

/**
 * The body as the EXTERNAL structure draws it: each closed planar contour is a prism through its
 * slice (half a slice spacing to either side), and a ray enters the body where it first enters one
 * of them, found exactly (even-odd rule, so holes drawn as inner contours stay out). Why not the
 * voxels: a contour is drawn to a fraction of a millimetre, while a voxel mask makes an oblique
 * surface a staircase of whole voxels.
 */
export interface BodySurface {
  /** Distance from `fromMm` along the segment to `toMm` where it first lies in the body; undefined when it never does. */
  entryMm(fromMm: Vec3, toMm: Vec3): number | undefined;
}

/** A contour in its slice's in-plane coordinates (mm along the row and the column direction from the origin), flat x, y pairs. */
type Polygon = Float64Array;

export function bodySurface(volume: CtVolume, external: Structure): BodySurface {
  const spacing = volume.sliceSpacingMm;
  const origin = volume.originMm;
  const slabs = new Map<number, Polygon[]>();
  for (const c of external.contours) {
    if (c.geometricType !== 'CLOSED_PLANAR' || c.pointsMm.length < 3) continue;
    // Each contour goes to the nearest slice within half a slice spacing, as its voxels would.
    const along = dot(sub(c.pointsMm[0]!, origin), volume.normal);
    const k = Math.round(along / spacing);
    if (k < 0 || k >= volume.slices || Math.abs(along - k * spacing) > spacing / 2) continue;
    const poly = new Float64Array(2 * c.pointsMm.length);
    c.pointsMm.forEach((p, i) => {
      const d = sub(p, origin);
      poly[2 * i] = dot(d, volume.rowDirection);
      poly[2 * i + 1] = dot(d, volume.columnDirection);
    });
    const list = slabs.get(k);
    if (list) list.push(poly);
    else slabs.set(k, [poly]);
  }

  return {
    entryMm(fromMm: Vec3, toMm: Vec3): number | undefined {
      const d = sub(toMm, fromMm);
      const length = norm(d);
      if (length === 0) return undefined;
      const rel = sub(fromMm, origin);
      // The segment in slice coordinates: along the normal (w), and in the plane (a, b), per mm of travel.
      const w0 = dot(rel, volume.normal);
      const wu = dot(d, volume.normal) / length;
      const a0 = dot(rel, volume.rowDirection);
      const au = dot(d, volume.rowDirection) / length;
      const b0 = dot(rel, volume.columnDirection);
      const bu = dot(d, volume.columnDirection) / length;
      const firstInside = (k: number, s0: number, s1: number): number | undefined => {
        const polys = slabs.get(k);
        if (!polys || s1 < s0) return undefined;
        const pa = a0 + s0 * au;
        const pb = b0 + s0 * bu;
        if (insideEvenOdd(polys, pa, pb)) return s0;
        const t = firstCrossing(polys, pa, pb, (s1 - s0) * au, (s1 - s0) * bu);
        return t === undefined ? undefined : s0 + t * (s1 - s0);
      };
      if (Math.abs(wu) < 1e-12) {
        // Travelling within one slice plane.
        const k = Math.round(w0 / spacing);
        return Math.abs(w0 - k * spacing) <= spacing / 2 ? firstInside(k, 0, length) : undefined;
      }
      // The slabs the segment crosses, in the order it crosses them.
      const kFrom = Math.round(w0 / spacing);
      const kTo = Math.round((w0 + length * wu) / spacing);
      const step = kTo >= kFrom ? 1 : -1;
      for (let k = kFrom; k !== kTo + step; k += step) {
        const enter = ((k - 0.5 * step) * spacing - w0) / wu;
        const leave = ((k + 0.5 * step) * spacing - w0) / wu;
        const s = firstInside(k, Math.max(0, enter), Math.min(length, leave));
        if (s !== undefined) return s;
      }
      return undefined;
    },
  };
}

function insideEvenOdd(polys: readonly Polygon[], x: number, y: number): boolean {
  let inside = false;
  for (const p of polys) {
    const n = p.length / 2;
    for (let i = 0, j = n - 1; i < n; j = i++) {
      const xi = p[2 * i]!;
      const yi = p[2 * i + 1]!;
      const xj = p[2 * j]!;
      const yj = p[2 * j + 1]!;
      if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
    }
  }
  return inside;
}

/** The smallest t in (0, 1] where the segment (x, y) + t·(dx, dy) crosses an edge of the polygons. */
function firstCrossing(polys: readonly Polygon[], x: number, y: number, dx: number, dy: number): number | undefined {
  let best: number | undefined;
  for (const p of polys) {
    const n = p.length / 2;
    for (let i = 0, j = n - 1; i < n; j = i++) {
      const ex = p[2 * i]! - p[2 * j]!;
      const ey = p[2 * i + 1]! - p[2 * j + 1]!;
      const den = dx * ey - dy * ex;
      if (den === 0) continue;
      const wx = p[2 * j]! - x;
      const wy = p[2 * j + 1]! - y;
      const t = (wx * ey - wy * ex) / den;
      const q = (wx * dy - wy * dx) / den;
      if (t > 0 && t <= 1 && q >= 0 && q <= 1 && (best === undefined || t < best)) best = t;
    }
  }
  return best;
}
