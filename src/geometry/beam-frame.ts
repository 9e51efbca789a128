import type { ControlPoint, PatientPosition } from '../model/index.js';
import { type Mat3, type Vec3, add, apply, multiply, rotationY, rotationZ, sub, transpose } from './vector.js';

/**
 * IEC 61217 as DICOM uses it: a point v in the BEAM LIMITING DEVICE frame (Zb towards the source,
 * origin at the isocenter; the source at (0, 0, SAD)) maps to DICOM patient coordinates (LPS) by
 *   p = Iso + P(position) · Rz(−couch) · Ry(gantry) · Rz(collimator) · v
 * (active rotations, right-handed: positive angles clockwise seen looking along +axis).
 * P maps the patient-support axes (X right of an observer facing the gantry from the couch foot,
 * Y towards the gantry, Z up) to LPS for each patient position.
 */
const POSITION_TO_LPS: Partial<Record<PatientPosition, Mat3>> = {
  HFS: [
    [1, 0, 0],
    [0, 0, -1],
    [0, 1, 0],
  ],
  HFP: [
    [-1, 0, 0],
    [0, 0, 1],
    [0, 1, 0],
  ],
  FFS: [
    [-1, 0, 0],
    [0, 0, -1],
    [0, -1, 0],
  ],
  FFP: [
    [1, 0, 0],
    [0, 0, 1],
    [0, -1, 0],
  ],
};

export const SUPPORTED_POSITIONS = Object.keys(POSITION_TO_LPS) as PatientPosition[];

export interface BeamFrame {
  readonly isocenterPatientMm: Vec3;
  readonly sadMm: number;
  /** BEAM LIMITING DEVICE frame → patient (LPS), rotation only. */
  readonly bldToPatient: Mat3;
  readonly sourcePatientMm: Vec3;
  /** Unit vector from the source towards the isocenter, patient frame. */
  readonly directionPatient: Vec3;
}

/** The beam's frame at one control point, or undefined for a position the geometry does not support. */
export function beamFrame(cp: ControlPoint, position: PatientPosition, sadMm: number): BeamFrame | undefined {
  const p = POSITION_TO_LPS[position];
  if (!p || !cp.isocenterPatientMm) return undefined;
  const r = multiply(p, multiply(rotationZ(-cp.couchAngleDeg), multiply(rotationY(cp.gantryAngleDeg), rotationZ(cp.collimatorAngleDeg))));
  const iso = cp.isocenterPatientMm as Vec3;
  const source = add(iso, apply(r, [0, 0, sadMm]));
  const dir = apply(r, [0, 0, -1]);
  return { isocenterPatientMm: iso, sadMm, bldToPatient: r, sourcePatientMm: source, directionPatient: dir };
}

/** A patient point in the BEAM LIMITING DEVICE frame (mm): x, y across the beam, z towards the source. */
export function patientToBld(frame: BeamFrame, pointPatientMm: Vec3): Vec3 {
  return apply(transpose(frame.bldToPatient), sub(pointPatientMm, frame.isocenterPatientMm));
}

/** A BEAM LIMITING DEVICE point back to patient coordinates. */
export function bldToPatient(frame: BeamFrame, pointBldMm: Vec3): Vec3 {
  return add(frame.isocenterPatientMm, apply(frame.bldToPatient, pointBldMm));
}
