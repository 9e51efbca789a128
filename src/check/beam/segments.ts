import type { ControlPoint } from '../../model/index.js';

/** One stretch of delivery between two control points, with the MU share it delivers. */
export interface Segment {
  readonly from: number;
  readonly share: number;
  /** The control point in the middle: mean gantry angle and leaf and jaw positions. */
  readonly mid: ControlPoint;
  readonly ssdMm?: number;
}

/** The segments between consecutive control points that deliver meterset, each with its share of the beam's MU. */
export function segmentsOf(cps: readonly ControlPoint[], finalWeight: number | undefined): Segment[] {
  const total = finalWeight ?? cps[cps.length - 1]!.cumulativeMetersetWeight;
  const gantryMoves = cps.some((c) => c.gantryAngleDeg !== cps[0]!.gantryAngleDeg);
  const out: Segment[] = [];
  for (let i = 0; i + 1 < cps.length; i++) {
    const a = cps[i]!;
    const b = cps[i + 1]!;
    const share = (b.cumulativeMetersetWeight - a.cumulativeMetersetWeight) / total;
    if (!(share > 0)) continue;
    // With the gantry still, the first control point's SSD holds for all; else each its own.
    const ssds = gantryMoves
      ? [a.ssdMm, b.ssdMm].filter((v): v is number => v !== undefined)
      : [a.ssdMm ?? cps[0]!.ssdMm].filter((v): v is number => v !== undefined);
    out.push({ from: i, share, mid: midway(a, b), ...(ssds.length ? { ssdMm: ssds.reduce((s, v) => s + v, 0) / ssds.length } : {}) });
  }
  return out;
}

/** The control point halfway between a and b: gantry angle the short way round, devices averaged. */
function midway(a: ControlPoint, b: ControlPoint): ControlPoint {
  const turn = ((((b.gantryAngleDeg - a.gantryAngleDeg) % 360) + 540) % 360) - 180;
  const gantry = (((a.gantryAngleDeg + turn / 2) % 360) + 360) % 360;
  const devices = a.devices.map((d) => {
    const e = b.devices.find((x) => x.type === d.type);
    return e ? { type: d.type, positionsMm: d.positionsMm.map((p, k) => (p + e.positionsMm[k]!) / 2) } : d;
  });
  return { ...a, gantryAngleDeg: gantry, devices };
}
