import type { CtVolume } from '../model/index.js';

/** The patient's CT as the check uses it: the volume, the clinic's HU → density table, the body threshold. */
export interface PatientCt {
  readonly volume: CtVolume;
  readonly density: (hu: number) => number;
  readonly densityTable: string;
  readonly bodyThresholdHu: number;
  /** The body from an EXTERNAL structure, when given (else the threshold). */
  readonly bodyMask?: Uint8Array;
  /** How the body surface was found, for the result: `EXTERNAL "Body"` or `HU >= -400`. */
  readonly bodySource: string;
}
