import type { CtVolume } from '../model/index.js';
import { traceRay } from './ray-trace.js';
import { type Vec3, add, norm, scale, sub } from './vector.js';

export interface CtDepthOptions {
  /** Voxels at or above this HU are the body (used when no EXTERNAL contour is given). */
  readonly bodyThresholdHu: number;
  /** The body from the EXTERNAL contour, one byte per voxel; overrides the threshold. */
  readonly bodyMask?: Uint8Array;
  /** Relative electron density for an HU value; NaN when the clinic's table does not cover it. */
  readonly density: (hu: number) => number;
  /** A density step larger than this along the ray is an interface. */
  readonly interfaceStep?: number;
}

export interface CtDepth {
  readonly entryPatientMm: Vec3;
  /** Source to the body surface along the ray to the point. */
  readonly ssdMm: number;
  readonly sourceToPointMm: number;
  readonly geometricDepthMm: number;
  /** Σ ℓ·ρe from the surface to the point. */
  readonly radiologicalDepthMm: number;
  readonly densityRange: readonly [number, number];
  /** Distance upstream from the point to the nearest density interface inside the body, if any. */
  readonly nearestInterfaceMm?: number;
  /** The media met from the surface to the point, each with its density and the distance from its upper face to the point. */
  readonly layers: readonly { readonly distanceToPointMm: number; readonly density: number }[];
}

export type CtDepthOutcome = { readonly ok: true; readonly value: CtDepth } | { readonly ok: false; readonly message: string };

/**
 * SSD, geometric and radiological depth of a point along the ray from the source, from the CT:
 * the surface is where the ray first meets a voxel at or above the body threshold.
 */
export function ctDepth(volume: CtVolume, sourceMm: Vec3, pointMm: Vec3, o: CtDepthOptions): CtDepthOutcome {
  const total = norm(sub(pointMm, sourceMm));
  let entry = -1;
  let radiological = 0;
  let lo = Infinity;
  let hi = -Infinity;
  let lastDensity = Number.NaN;
  let lastInterface = -1;
  let refused: number | undefined;
  const step = o.interfaceStep ?? 0.2;
  const layers: { distanceToPointMm: number; density: number }[] = [];
  traceRay(volume, sourceMm, pointMm, (voxel, start, length) => {
    if (refused !== undefined) return;
    const hu = volume.hu[voxel]!;
    if (entry < 0) {
      if (o.bodyMask ? o.bodyMask[voxel] === 0 : hu < o.bodyThresholdHu) return;
      entry = start;
    }
    const rho = o.density(hu);
    if (Number.isNaN(rho)) {
      refused = hu;
      return;
    }
    if (!Number.isNaN(lastDensity) && Math.abs(rho - lastDensity) > step) lastInterface = start;
    if (rho !== lastDensity) layers.push({ distanceToPointMm: total - start, density: rho });
    lastDensity = rho;
    lo = Math.min(lo, rho);
    hi = Math.max(hi, rho);
    radiological += rho * length;
  });
  if (refused !== undefined) return { ok: false, message: `HU ${refused} on the ray lies outside the HU to electron density table` };
  if (entry < 0) return { ok: false, message: 'the ray from the source to the point meets no body voxel: the point is outside the body (or outside the CT)' };
  const dir = scale(sub(pointMm, sourceMm), 1 / total);
  return {
    ok: true,
    value: {
      entryPatientMm: add(sourceMm, scale(dir, entry)),
      ssdMm: entry,
      sourceToPointMm: total,
      geometricDepthMm: total - entry,
      radiologicalDepthMm: radiological,
      densityRange: [lo, hi],
      ...(lastInterface >= 0 ? { nearestInterfaceMm: total - lastInterface } : {}),
      layers,
    },
  };
}

/** Source to the body surface along the central axis (for the SSD cross-check with the plan). */
export function ctSsdAlongAxisMm(volume: CtVolume, sourceMm: Vec3, directionPatient: Vec3, maxMm: number, bodyThresholdHu: number, bodyMask?: Uint8Array): number | undefined {
  let entry: number | undefined;
  traceRay(volume, sourceMm, add(sourceMm, scale(directionPatient, maxMm)), (voxel, start) => {
    if (entry === undefined && (bodyMask ? bodyMask[voxel] === 1 : volume.hu[voxel]! >= bodyThresholdHu)) entry = start;
  });
  return entry;
}
