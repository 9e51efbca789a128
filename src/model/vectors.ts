import { z } from 'zod';

/** A finite number (NaN and ±Infinity never enter the model). */
export const finite = z.number().finite();

/** A point or vector in DICOM patient coordinates (LPS), mm. */
export const PatientPointMm = z.tuple([finite, finite, finite]).readonly();
export type PatientPointMm = z.infer<typeof PatientPointMm>;
