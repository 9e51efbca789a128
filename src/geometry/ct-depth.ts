import type { CtVolume } from '../model/index.js';
import type { BodySurface } from './body-surface.js';
import { traceRay } from './ray-trace.js';
import { type Vec3, add, norm, scale, sub } from './vector.js';

export interface CtDepthOptions {
  /** Voxels at or above this HU are the body (used when no EXTERNAL contour is given). */
  readonly bodyThresholdHu: number;
  /** The body from the EXTERNAL contour, its surface found exactly; overrides the threshold. */
  readonly body?: BodySurface;
  /** Relative electron density for an HU value; NaN when the clinic's table does not cover it. */
  readonly density: (hu: number) => number;
  /** A density step larger than this along the ray is an interface (and starts a new layer). */
  readonly interfaceStep?: number;
}

/** A layer thinner than this (mm) along the ray is a sliver of the voxel grid, not a medium: it joins its neighbour. */
export const SLIVER_MM = 0.5;

/** The default interface step in relative electron density (common practice, no source: above CT noise of ±20 HU, below water to lung or bone). */
export const DENSITY_STEP = 0.2;

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
  /**
   * The media met from the surface to the point, each with its mean density and the distance from its
   * upper face to the point: voxels join the current layer while their density stays within the
   * interface step of its mean (CT noise is not an interface), and slivers join their neighbour.
   */
  readonly layers: readonly { readonly distanceToPointMm: number; readonly density: number }[];
  /** Once projected on the central axis (projectOnAxis): the cosine of the ray's angle to it and the distances along the ray. */
  readonly alongRay?: {
    readonly cosine: number;
    readonly ssdMm: number;
    readonly geometricDepthMm: number;
    readonly radiologicalDepthMm: number;
  };
}

/**
 * Why the CT cannot give a ray's depth, as data (the report words it): the ray misses the drawn body;
 * an HU outside the density table; no body voxel on the ray; the point beyond the CT (`gapMm` short);
 * the field of view cutting the body at the first voxel (by the threshold); the drawn body starting
 * before the CT does (`gapMm` of it outside).
 */
export type CtRefusal =
  | { readonly reason: 'misses-external' }
  | { readonly reason: 'hu-outside-table'; readonly hu: number }
  | { readonly reason: 'no-body-voxel' }
  | { readonly reason: 'point-outside-ct'; readonly gapMm: number }
  | { readonly reason: 'field-of-view-cuts-body'; readonly bodyThresholdHu: number }
  | { readonly reason: 'external-outside-ct'; readonly gapMm: number };

export type CtDepthOutcome = { readonly ok: true; readonly value: CtDepth } | { readonly ok: false; readonly refusal: CtRefusal };

/**
 * SSD, geometric and radiological depth of a point along the ray from the source, from the CT:
 * the surface is where the ray enters the EXTERNAL contour when given, else where it first meets a
 * voxel at or above the body threshold. The radiological depth adds up the voxels' densities from
 * the surface on (a voxel the surface cuts counts from the surface).
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
  const step = o.interfaceStep ?? DENSITY_STEP;
  const layers: Layer[] = [];
  const surface = o.body ? o.body.entryMm(sourceMm, pointMm) : undefined;
  if (o.body && surface === undefined) return { ok: false, refusal: { reason: 'misses-external' } };
  let firstVoxelMm = -1;
  let lastVoxelEndMm = -1;
  traceRay(volume, sourceMm, pointMm, (voxel, voxelStart, voxelLength) => {
    if (refused !== undefined) return;
    if (firstVoxelMm < 0) firstVoxelMm = voxelStart;
    lastVoxelEndMm = voxelStart + voxelLength;
    const hu = volume.hu[voxel]!;
    let start = voxelStart;
    let length = voxelLength;
    if (surface !== undefined) {
      if (voxelStart + voxelLength <= surface) return;
      start = Math.max(voxelStart, surface);
      length = voxelStart + voxelLength - start;
      if (entry < 0) entry = start;
    } else if (entry < 0) {
      if (hu < o.bodyThresholdHu) return;
      entry = start;
    }
    const rho = o.density(hu);
    if (Number.isNaN(rho)) {
      refused = hu;
      return;
    }
    if (!Number.isNaN(lastDensity) && Math.abs(rho - lastDensity) > step) lastInterface = start;
    addToLayers(layers, start, length, rho, step);
    lastDensity = rho;
    lo = Math.min(lo, rho);
    hi = Math.max(hi, rho);
    radiological += rho * length;
  });
  if (refused !== undefined) return { ok: false, refusal: { reason: 'hu-outside-table', hu: refused } };
  if (entry < 0) return { ok: false, refusal: { reason: 'no-body-voxel' } };
  if (lastVoxelEndMm < total - 1e-6) return { ok: false, refusal: { reason: 'point-outside-ct', gapMm: total - lastVoxelEndMm } };
  // By the threshold, a body already there in the first voxel the ray meets runs out of the CT's
  // field of view: where it begins (the SSD) is unknown.
  if (surface === undefined && entry === firstVoxelMm && firstVoxelMm > 0)
    return { ok: false, refusal: { reason: 'field-of-view-cuts-body', bodyThresholdHu: o.bodyThresholdHu } };
  // The drawn body must lie in the CT where the ray enters it: outside, there are no densities to add.
  if (surface !== undefined && entry > surface + 1e-6) return { ok: false, refusal: { reason: 'external-outside-ct', gapMm: entry - surface } };
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
      layers: mergeSlivers(layers).map((l) => ({ distanceToPointMm: total - l.startMm, density: l.densityLength / l.lengthMm })),
    },
  };
}

interface Layer {
  startMm: number;
  lengthMm: number;
  /** Σ ρ·ℓ over the layer's pieces. */
  densityLength: number;
}

/** A piece of the ray joins the current layer unless its density is more than the step from the layer's mean. */
function addToLayers(layers: Layer[], startMm: number, lengthMm: number, rho: number, step: number): void {
  const last = layers[layers.length - 1];
  if (last && Math.abs(rho - last.densityLength / last.lengthMm) <= step) {
    last.lengthMm += lengthMm;
    last.densityLength += rho * lengthMm;
  } else if (lengthMm > 0) layers.push({ startMm, lengthMm, densityLength: rho * lengthMm });
}

/** Slivers (thinner than SLIVER_MM) join the layer before them, or the one after for the first. */
function mergeSlivers(layers: readonly Layer[]): Layer[] {
  const out: Layer[] = [];
  for (const l of layers) {
    const last = out[out.length - 1];
    if (last && (l.lengthMm < SLIVER_MM || last.lengthMm < SLIVER_MM)) {
      last.lengthMm += l.lengthMm;
      last.densityLength += l.densityLength;
    } else out.push({ ...l });
  }
  return out;
}

/** Source to the body surface along the central axis (for the SSD cross-check with the plan). */
export function ctSsdAlongAxisMm(
  volume: CtVolume,
  sourceMm: Vec3,
  directionPatient: Vec3,
  maxMm: number,
  bodyThresholdHu: number,
  body?: BodySurface,
): number | undefined {
  const farMm = add(sourceMm, scale(directionPatient, maxMm));
  if (body) return body.entryMm(sourceMm, farMm);
  let entry: number | undefined;
  let first: number | undefined;
  traceRay(volume, sourceMm, farMm, (voxel, start) => {
    first ??= start;
    if (entry === undefined && volume.hu[voxel]! >= bodyThresholdHu) entry = start;
  });
  // A body already in the first voxel runs out of the CT's field of view: its surface is unknown.
  return entry !== undefined && entry === first ? undefined : entry;
}
