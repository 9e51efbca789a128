import { MM_PER_CM, note, type Note } from '../../model/index.js';
import type { Policy } from '../policy.js';

/** The point near or beyond the field edge (distance at the point's depth, cm; negative outside). */
export function edgeFlags(edgeDistanceCm: number, policy: Policy): Note[] {
  if (edgeDistanceCm >= policy.point.edgeMarginCm) return [];
  return [
    edgeDistanceCm < 0
      ? note('outside-field', { beyondCm: -edgeDistanceCm })
      : note('near-field-edge', { edgeDistanceCm, marginCm: policy.point.edgeMarginCm }),
  ];
}

/** A photon point shallower than dmax. */
export function buildUpFlags(depthCm: number, dmaxCm: number): Note[] {
  return depthCm < dmaxCm ? [note('build-up', { depthCm, dmaxCm })] : [];
}

/**
 * Where an electron depth dose is too steep for a point check (common practice, no source): on the
 * way up, below 90 % of the maximum (the build-up proper: a point 1 mm above dmax at 99.97 % is not
 * in it); past dmax, below 80 % (the fall-off, where a millimetre moves the dose by percents).
 */
export const ELECTRON_BUILD_UP_PERCENT = 90;
export const ELECTRON_FALL_OFF_PERCENT = 80;

/** An electron point in the steep build-up or the fall-off of its depth dose, by the PDD there (lookup depth, cm). */
export function electronDepthFlags(depthCm: number, dmaxCm: number | undefined, pddPercent: number): Note[] {
  const shallow = dmaxCm !== undefined && depthCm < dmaxCm;
  if (shallow && pddPercent < ELECTRON_BUILD_UP_PERCENT)
    return [note('electron-build-up', { depthCm, dmaxCm, pddPercent, thresholdPercent: ELECTRON_BUILD_UP_PERCENT })];
  if (!shallow && pddPercent < ELECTRON_FALL_OFF_PERCENT)
    return [note('steep-fall-off', { pddPercent, thresholdPercent: ELECTRON_FALL_OFF_PERCENT })];
  return [];
}

/** A point just past a density interface along the ray (distance upstream, mm). */
export function interfaceFlags(nearestInterfaceMm: number | undefined, policy: Policy): Note[] {
  if (nearestInterfaceMm === undefined || nearestInterfaceMm >= policy.point.interfaceMarginCm * MM_PER_CM) return [];
  return [note('past-interface', { distanceMm: nearestInterfaceMm, marginCm: policy.point.interfaceMarginCm })];
}
