import type { Keyword } from './dictionary.js';

/**
 * The values an attribute can hold in a real treatment plan, CT or dose grid: the standard's own
 * ranges where it defines one (angles, PS3.3 C.8.8.14), else a bound no external-beam treatment
 * reaches (common practice, no source). A value outside is an input error, never a number to
 * compute with: a gantry of 1e9 or a prescription of −100 Gy cannot have come from a planning system.
 * Bounds of what a particular machine can do (field size, MU per beam) are the beam data's.
 */
export interface Plausible {
  readonly min: number;
  readonly max: number;
  /** The bound itself is excluded (an angle of 360 is written 0). */
  readonly minExclusive?: boolean;
  readonly maxExclusive?: boolean;
  readonly unit: string;
}

const range = (min: number, max: number, unit: string, open: { minExclusive?: boolean; maxExclusive?: boolean } = {}): Plausible => ({
  min,
  max,
  unit,
  ...open,
});

const ANGLE = range(0, 360, 'degrees', { maxExclusive: true });
/** Patient coordinates: ten metres either way is far beyond any patient and any table travel. */
const PATIENT_MM = range(-10_000, 10_000, 'mm');
/** Source distances: a total-body setup reaches about 4 m. */
const SOURCE_MM = range(0, 10_000, 'mm', { minExclusive: true });
/** Doses in Gy: beyond 1 000 Gy is no external-beam dose. */
const DOSE_GY = range(0, 1_000, 'Gy');

export const PLAUSIBLE: Partial<Record<Keyword, Plausible>> = {
  GantryAngle: ANGLE,
  BeamLimitingDeviceAngle: ANGLE,
  PatientSupportAngle: ANGLE,
  TableTopEccentricAngle: ANGLE,
  WedgeOrientation: ANGLE,
  WedgeAngle: range(0, 90, 'degrees'),
  EffectiveWedgeAngle: range(0, 90, 'degrees'),
  NominalBeamEnergy: range(0, 1_000, 'MeV', { minExclusive: true }),
  BeamMeterset: range(0, 100_000, 'MU'),
  FinalCumulativeMetersetWeight: range(0, 1e9, '', { minExclusive: true }),
  CumulativeMetersetWeight: range(0, 1e9, ''),
  BeamDose: range(0, 100, 'Gy per fraction'),
  AlternateBeamDose: range(0, 100, 'Gy per fraction'),
  // A prescription of nothing prescribes nothing; no external-beam course prescribes 200 Gy.
  TargetPrescriptionDose: range(0, 200, 'Gy', { minExclusive: true }),
  TargetMinimumDose: DOSE_GY,
  TargetMaximumDose: DOSE_GY,
  OrganAtRiskMaximumDose: DOSE_GY,
  DeliveryWarningDose: DOSE_GY,
  DeliveryMaximumDose: DOSE_GY,
  NumberOfFractionsPlanned: range(1, 1_000, 'fractions'),
  SourceAxisDistance: SOURCE_MM,
  SourceToSurfaceDistance: SOURCE_MM,
  BeamDosePointSSD: SOURCE_MM,
  BeamDosePointSourceToExternalContourDistance: SOURCE_MM,
  SourceToBeamLimitingDeviceDistance: SOURCE_MM,
  SourceToWedgeTrayDistance: SOURCE_MM,
  SourceToBlockTrayDistance: SOURCE_MM,
  SourceToCompensatorTrayDistance: SOURCE_MM,
  BeamDosePointDepth: range(0, 1_000, 'mm'),
  BeamDosePointEquivalentDepth: range(0, 1_000, 'mm'),
  // Jaw and leaf positions in the isocenter plane: a metre from the axis is no collimator.
  LeafJawPositions: range(-1_000, 1_000, 'mm'),
  LeafPositionBoundaries: range(-1_000, 1_000, 'mm'),
  IsocenterPosition: PATIENT_MM,
  BeamDoseSpecificationPoint: PATIENT_MM,
  DoseReferencePointCoordinates: PATIENT_MM,
  SurfaceEntryPoint: PATIENT_MM,
  ImagePositionPatient: PATIENT_MM,
  GridFrameOffsetVector: PATIENT_MM,
  PixelSpacing: range(0, 1_000, 'mm', { minExclusive: true }),
  WedgeFactor: range(0, 2, '', { minExclusive: true }),
  TotalBlockTrayFactor: range(0, 2, '', { minExclusive: true }),
  BlockTransmission: range(0, 1, ''),
  BlockThickness: range(0, 1_000, 'mm'),
  // Gy per stored unit: a grid of 1 Gy per unit already spans 65 536 Gy in 16 bits.
  DoseGridScaling: range(0, 1, 'Gy per unit', { minExclusive: true }),
};

/** Whether `v` lies in the plausible range. */
export function isPlausible(v: number, p: Plausible): boolean {
  if (!Number.isFinite(v)) return false;
  const aboveMin = p.minExclusive ? v > p.min : v >= p.min;
  const belowMax = p.maxExclusive ? v < p.max : v <= p.max;
  return aboveMin && belowMax;
}

/** The range in words, for the message: "0 <= value < 360 degrees". */
export function plausibleText(p: Plausible): string {
  return `${p.min} ${p.minExclusive ? '<' : '<='} value ${p.maxExclusive ? '<' : '<='} ${p.max}${p.unit ? ` ${p.unit}` : ''}`;
}
