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

/** A point just past a density interface along the ray (distance upstream, mm). */
export function interfaceFlags(nearestInterfaceMm: number | undefined, policy: Policy): Note[] {
  if (nearestInterfaceMm === undefined || nearestInterfaceMm >= policy.point.interfaceMarginCm * MM_PER_CM) return [];
  return [note('past-interface', { distanceMm: nearestInterfaceMm, marginCm: policy.point.interfaceMarginCm })];
}
