import { z } from 'zod';
import { finite } from './vectors.js';
import { BeamLimitingDeviceType, ControlPoint } from './control-point.js';

export const RadiationType = z.enum(['PHOTON', 'ELECTRON', 'NEUTRON', 'PROTON', 'ION']);
export type RadiationType = z.infer<typeof RadiationType>;

export const BeamLimitingDevice = z
  .object({
    type: BeamLimitingDeviceType,
    numberOfPairs: z.number().int().positive(),
    /** N + 1 boundaries for N leaf pairs, mm at the isocenter plane (along Y for MLCX). */
    leafBoundariesMm: z.array(finite).readonly().optional(),
    sourceToDeviceDistanceMm: finite.optional(),
  })
  .readonly();
export type BeamLimitingDevice = z.infer<typeof BeamLimitingDevice>;

export const Wedge = z
  .object({
    number: z.number().int(),
    type: z.string().optional(),
    id: z.string().optional(),
    angleDeg: finite.optional(),
    factor: finite.optional(),
    orientationDeg: finite.optional(),
    sourceToWedgeTrayDistanceMm: finite.optional(),
    effectiveAngleDeg: finite.optional(),
  })
  .readonly();
export type Wedge = z.infer<typeof Wedge>;

export const Compensator = z
  .object({
    number: z.number().int().optional(),
    type: z.string().optional(),
    id: z.string().optional(),
    materialId: z.string().optional(),
    rows: z.number().int().optional(),
    columns: z.number().int().optional(),
    sourceToTrayDistanceMm: finite.optional(),
  })
  .readonly();
export type Compensator = z.infer<typeof Compensator>;

export const Block = z
  .object({
    number: z.number().int(),
    name: z.string().optional(),
    trayId: z.string().optional(),
    sourceToTrayDistanceMm: finite.optional(),
    type: z.enum(['SHIELDING', 'APERTURE']),
    divergence: z.enum(['PRESENT', 'ABSENT']).optional(),
    mountingPosition: z.string().optional(),
    materialId: z.string().optional(),
    thicknessMm: finite.optional(),
    transmission: finite.optional(),
    /** Outline vertices (x, y), mm in IEC BEAM LIMITING DEVICE coordinates at the isocenter plane. */
    outlineMm: z.array(z.tuple([finite, finite]).readonly()).readonly(),
  })
  .readonly();
export type Block = z.infer<typeof Block>;

export const Applicator = z.object({ id: z.string(), type: z.string(), description: z.string().optional() }).readonly();
export type Applicator = z.infer<typeof Applicator>;

/** The planning system's own depth data for a dose reference (Beam Dose Verification Control Point). */
export const DoseVerificationPoint = z
  .object({
    cumulativeMetersetWeight: finite.optional(),
    controlPointIndex: z.number().int().optional(),
    pointDepthMm: finite.optional(),
    equivalentDepthMm: finite.optional(),
    ssdMm: finite.optional(),
    sourceToExternalContourMm: finite.optional(),
  })
  .readonly();

export type DoseVerificationPoint = z.infer<typeof DoseVerificationPoint>;

export const BeamDoseVerification = z
  .object({
    doseReferenceNumber: z.number().int(),
    depthValueAveraging: z.boolean().optional(),
    points: z.array(DoseVerificationPoint).readonly(),
  })
  .readonly();
export type BeamDoseVerification = z.infer<typeof BeamDoseVerification>;

export const Beam = z
  .object({
    number: z.number().int(),
    name: z.string().optional(),
    description: z.string().optional(),
    machineName: z.string().optional(),
    manufacturer: z.string().optional(),
    manufacturerModelName: z.string().optional(),
    deviceSerialNumber: z.string().optional(),
    radiationType: RadiationType,
    beamType: z.enum(['STATIC', 'DYNAMIC']),
    treatmentDeliveryType: z.string().optional(),
    /** Unit of this beam's meterset: MU for linacs (MINUTE for isotope units). */
    primaryDosimeterUnit: z.enum(['MU', 'MINUTE']).optional(),
    sourceAxisDistanceMm: finite.optional(),
    patientSetupNumber: z.number().int().optional(),
    finalCumulativeMetersetWeight: finite.optional(),
    limitingDevices: z.array(BeamLimitingDevice).readonly(),
    wedges: z.array(Wedge).readonly(),
    compensators: z.array(Compensator).readonly(),
    bolusRoiNumbers: z.array(z.number().int()).readonly(),
    blocks: z.array(Block).readonly(),
    totalBlockTrayFactor: finite.optional(),
    applicators: z.array(Applicator).readonly(),
    doseVerification: z.array(BeamDoseVerification).readonly(),
    controlPoints: z.array(ControlPoint).readonly(),
  })
  .readonly();
export type Beam = z.infer<typeof Beam>;
