import { z } from 'zod';
import { finite, PatientPointMm } from './vectors.js';

export const DoseReference = z
  .object({
    number: z.number().int(),
    uid: z.string().optional(),
    structureType: z.string(),
    description: z.string().optional(),
    roiNumber: z.number().int().optional(),
    pointPatientMm: PatientPointMm.optional(),
    type: z.string().optional(),
    targetPrescriptionDoseGy: finite.optional(),
    targetMinimumDoseGy: finite.optional(),
    targetMaximumDoseGy: finite.optional(),
    deliveryWarningDoseGy: finite.optional(),
    deliveryMaximumDoseGy: finite.optional(),
    organAtRiskMaximumDoseGy: finite.optional(),
  })
  .readonly();
export type DoseReference = z.infer<typeof DoseReference>;
