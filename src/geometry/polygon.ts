/** A closed polygon in a plane, (x, y) vertices in order (a block outline at the isocenter plane, mm). */
export type Polygon = readonly (readonly [number, number])[];

/** Even-odd rule: inside when a ray from the point crosses the outline an odd number of times. */
export function insidePolygon(poly: Polygon, x: number, y: number): boolean {
  let inside = false;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [xi, yi] = poly[i]!;
    const [xj, yj] = poly[j]!;
    if (yi > y !== yj > y && x < ((xj - xi) * (y - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Distances along the ray (x, y) + s·(dx, dy), s > 0, where it crosses the polygon's edges. */
export function polygonRayCrossings(poly: Polygon, x: number, y: number, dx: number, dy: number): number[] {
  const out: number[] = [];
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [ax, ay] = poly[j]!;
    const [bx, by] = poly[i]!;
    const ex = bx - ax;
    const ey = by - ay;
    const den = dx * ey - dy * ex;
    if (Math.abs(den) < 1e-12) continue;
    const wx = ax - x;
    const wy = ay - y;
    const s = (wx * ey - wy * ex) / den;
    const q = (wx * dy - wy * dx) / den;
    if (s > 1e-9 && q >= 0 && q <= 1) out.push(s);
  }
  return out.sort((a, b) => a - b);
}

/** Distance from (x, y) to the nearest edge of the polygon. */
export function polygonEdgeDistance(poly: Polygon, x: number, y: number): number {
  let d = Infinity;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) {
    const [ax, ay] = poly[j]!;
    const [bx, by] = poly[i]!;
    const ex = bx - ax;
    const ey = by - ay;
    const len2 = ex * ex + ey * ey;
    const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((x - ax) * ex + (y - ay) * ey) / len2));
    d = Math.min(d, Math.hypot(x - (ax + t * ex), y - (ay + t * ey)));
  }
  return d;
}

/** Enclosed area by the shoelace formula (either winding). */
export function polygonArea(poly: Polygon): number {
  let twice = 0;
  for (let i = 0, j = poly.length - 1; i < poly.length; j = i++) twice += poly[j]![0] * poly[i]![1] - poly[i]![0] * poly[j]![1];
  return Math.abs(twice) / 2;
}

/** The sides of an axis-aligned rectangle given as its four corners, or undefined for any other shape. */
export function axisAlignedRectangle(poly: Polygon): { readonly x: number; readonly y: number } | undefined {
  if (poly.length !== 4) return undefined;
  const xs = [...new Set(poly.map((p) => p[0]))];
  const ys = [...new Set(poly.map((p) => p[1]))];
  if (xs.length !== 2 || ys.length !== 2) return undefined;
  return { x: Math.abs(xs[1]! - xs[0]!), y: Math.abs(ys[1]! - ys[0]!) };
}
