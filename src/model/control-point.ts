import { z } from 'zod';
import { finite, PatientPointMm } from './vectors.js';

/**
 * A list of finite numbers, checked in one pass. Why not z.array(finite): a VMAT plan holds some
 * 170 000 leaf positions, and a schema per value made the model's check a quarter of the import.
 */
const finiteNumbers = z.custom<readonly number[]>((v) => Array.isArray(v) && v.every((x) => typeof x === 'number' && Number.isFinite(x)), {
  message: 'expected a list of finite numbers',
});

export const RotationDirection = z.enum(['CW', 'CC', 'NONE']);
export type RotationDirection = z.infer<typeof RotationDirection>;

export const BeamLimitingDeviceType = z.enum(['X', 'Y', 'ASYMX', 'ASYMY', 'MLCX', 'MLCY']);
export type BeamLimitingDeviceType = z.infer<typeof BeamLimitingDeviceType>;

/**
 * Positions of one beam-limiting device, mm in IEC BEAM LIMITING DEVICE coordinates projected to
 * the isocenter plane. Jaws: [X1, X2] (or [Y1, Y2]). Leaves: bank 1 (leaves 1..N) then bank 2.
 */
export const DevicePosition = z.object({ type: BeamLimitingDeviceType, positionsMm: finiteNumbers }).readonly();
export type DevicePosition = z.infer<typeof DevicePosition>;

export const WedgePosition = z.object({ wedgeNumber: z.number().int(), position: z.enum(['IN', 'OUT']) }).readonly();
export type WedgePosition = z.infer<typeof WedgePosition>;

export const DoseReferenceCoefficient = z.object({ doseReferenceNumber: z.number().int(), cumulativeCoefficient: finite.optional() }).readonly();

/**
 * A control point with every value in force: DICOM sends only what changes after the first
 * control point, the importer carries the rest forward (except the SSD and entry point). Dose reference coefficients belong to
 * their control point alone and are not carried.
 */
export const ControlPoint = z
  .object({
    index: z.number().int().nonnegative(),
    nominalEnergyMeV: finite.optional(),
    doseRateSet: finite.optional(),
    gantryAngleDeg: finite,
    gantryRotation: RotationDirection.optional(),
    collimatorAngleDeg: finite,
    collimatorRotation: RotationDirection.optional(),
    couchAngleDeg: finite,
    couchRotation: RotationDirection.optional(),
    tableTopEccentricAxisDistanceMm: finite.optional(),
    tableTopEccentricAngleDeg: finite.optional(),
    tableTopEccentricRotation: RotationDirection.optional(),
    tableTopVerticalMm: finite.optional(),
    tableTopLongitudinalMm: finite.optional(),
    tableTopLateralMm: finite.optional(),
    tableTopPitchDeg: finite.optional(),
    tableTopRollDeg: finite.optional(),
    isocenterPatientMm: PatientPointMm.optional(),
    /** Entry point and SSD are this control point's alone (never carried: they depend on its gantry angle). */
    surfaceEntryPointPatientMm: PatientPointMm.optional(),
    ssdMm: finite.optional(),
    cumulativeMetersetWeight: finite,
    devices: z.array(DevicePosition).readonly(),
    wedgePositions: z.array(WedgePosition).readonly(),
    doseReferenceCoefficients: z.array(DoseReferenceCoefficient).readonly(),
  })
  .readonly();
export type ControlPoint = z.infer<typeof ControlPoint>;
