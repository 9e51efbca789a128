import type { BeamFrame } from './beam-frame.js';
import { patientToBld } from './beam-frame.js';
import type { Vec3 } from './vector.js';

export interface FlatDepth {
  /** Distance from the source to the point, projected on the central axis. */
  readonly sourceToPointAxialMm: number;
  /** Depth below a flat surface normal to the central axis at the plan's SSD. */
  readonly depthMm: number;
  /** Distance of the point from the central axis, at its depth. */
  readonly offAxisMm: number;
  /** The point in the BEAM LIMITING DEVICE frame. */
  readonly pointBldMm: Vec3;
  /** The point projected along its ray to the isocenter plane (Xb, Yb), where jaws and leaves are given. */
  readonly atIsocenterPlaneMm: readonly [number, number];
  /** The cosine of the angle between the ray to the point and the central axis. */
  readonly rayCosine: number;
}

/**
 * Depth without CT: the patient as water below a flat surface normal to the central axis at the
 * plan's SSD, so d = (distance from the source along the axis) − SSD.
 */
export function flatDepth(frame: BeamFrame, pointPatientMm: Vec3, ssdMm: number): FlatDepth {
  const v = patientToBld(frame, pointPatientMm);
  const axial = frame.sadMm - v[2];
  return {
    sourceToPointAxialMm: axial,
    depthMm: axial - ssdMm,
    offAxisMm: Math.hypot(v[0], v[1]),
    pointBldMm: v,
    atIsocenterPlaneMm: [(v[0] * frame.sadMm) / axial, (v[1] * frame.sadMm) / axial],
    rayCosine: axial / Math.hypot(axial, v[0], v[1]),
  };
}
