import { type BeamFrame, type BodySurface, type CtDepthOptions, ctSsdAlongAxisMm } from '../geometry/index.js';
import type { CtVolume } from '../model/index.js';

/** The patient's CT as the check uses it: the volume, the clinic's HU → density table, the body threshold. */
export interface PatientCt {
  readonly volume: CtVolume;
  readonly density: (hu: number) => number;
  readonly densityTable: string;
  readonly bodyThresholdHu: number;
  /** The body from an EXTERNAL structure, when given (else the threshold). */
  readonly body?: BodySurface;
  /** How the body surface was found, for the result: `EXTERNAL "Body"` or `HU >= -400`. */
  readonly bodySource: string;
}

/** How rays through this CT find the body and the densities. */
export function ctDepthOptions(ct: PatientCt): CtDepthOptions {
  return { bodyThresholdHu: ct.bodyThresholdHu, density: ct.density, ...(ct.body ? { body: ct.body } : {}) };
}

/** The SSD along a beam's central axis in this CT (for the cross-check with the plan's SSD). */
export function ctAxisSsdMm(ct: PatientCt, frame: BeamFrame, sadMm: number): number | undefined {
  return ctSsdAlongAxisMm(ct.volume, frame.sourcePatientMm, frame.directionPatient, 2 * sadMm, ct.bodyThresholdHu, ct.body);
}
