import { z } from 'zod';
import { finite, PatientPointMm } from './vectors.js';

/** One beam's entry in a fraction group: its meterset and the planning system's dose per fraction. */
export const ReferencedBeam = z
  .object({
    beamNumber: z.number().int(),
    /** Beam Meterset, in the beam's primary dosimeter unit (MU on a linac), per fraction. */
    beamMeterset: finite.nonnegative().optional(),
    beamDoseGy: finite.optional(),
    beamDoseSpecificationPointPatientMm: PatientPointMm.optional(),
    beamDoseType: z.string().optional(),
    alternateBeamDoseGy: finite.optional(),
    alternateBeamDoseType: z.string().optional(),
    doseReferenceUid: z.string().optional(),
    /** Older files carry the planning system's depth data here (retired location). */
    pointDepthMm: finite.optional(),
    equivalentDepthMm: finite.optional(),
    pointSsdMm: finite.optional(),
  })
  .readonly();
export type ReferencedBeam = z.infer<typeof ReferencedBeam>;

export const FractionGroup = z
  .object({
    number: z.number().int(),
    description: z.string().optional(),
    fractionsPlanned: z.number().int().nonnegative().optional(),
    beamDoseMeaning: z.string().optional(),
    doseReferences: z.array(z.object({ doseReferenceNumber: z.number().int(), targetPrescriptionDoseGy: finite.optional() }).readonly()).readonly(),
    beams: z.array(ReferencedBeam).readonly(),
  })
  .readonly();
export type FractionGroup = z.infer<typeof FractionGroup>;
