import { z } from 'zod';
import { Beam } from './beam.js';
import { DoseReference } from './dose-reference.js';
import { FractionGroup } from './fraction-group.js';

/** Patient positions of DICOM (0018,5100). The check supports the first four; the rest are recognised. */
export const PATIENT_POSITIONS = [
  'HFS',
  'HFP',
  'FFS',
  'FFP',
  'HFDR',
  'HFDL',
  'FFDR',
  'FFDL',
  'LFP',
  'LFS',
  'RFP',
  'RFS',
  'AFDR',
  'AFDL',
  'PFDR',
  'PFDL',
  'SITTING',
] as const;
export const PatientPosition = z.enum(PATIENT_POSITIONS);
export type PatientPosition = z.infer<typeof PatientPosition>;

export const PatientSetup = z
  .object({
    number: z.number().int(),
    position: PatientPosition.optional(),
    additionalPosition: z.string().optional(),
    setupTechnique: z.string().optional(),
  })
  .readonly();
export type PatientSetup = z.infer<typeof PatientSetup>;

export const Plan = z
  .object({
    sopClassUid: z.string(),
    sopInstanceUid: z.string(),
    studyInstanceUid: z.string().optional(),
    seriesInstanceUid: z.string().optional(),
    frameOfReferenceUid: z.string().optional(),
    patient: z.object({ id: z.string().optional(), name: z.string().optional() }).readonly(),
    label: z.string(),
    name: z.string().optional(),
    description: z.string().optional(),
    date: z.string().optional(),
    time: z.string().optional(),
    geometry: z.enum(['PATIENT', 'TREATMENT_DEVICE']).optional(),
    intent: z.string().optional(),
    approvalStatus: z.enum(['APPROVED', 'UNAPPROVED', 'REJECTED']).optional(),
    referencedStructureSetUids: z.array(z.string()).readonly(),
    referencedDoseUids: z.array(z.string()).readonly(),
    patientSetups: z.array(PatientSetup).readonly(),
    doseReferences: z.array(DoseReference).readonly(),
    fractionGroups: z.array(FractionGroup).readonly(),
    beams: z.array(Beam).readonly(),
  })
  .readonly();
export type Plan = z.infer<typeof Plan>;

/** Where a plan came from: the file and how it was encoded. */
export const PlanSource = z.object({ file: z.string(), transferSyntaxUid: z.string(), hasPart10Header: z.boolean() }).readonly();
export type PlanSource = z.infer<typeof PlanSource>;
