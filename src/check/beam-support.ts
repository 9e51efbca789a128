import { SUPPORTED_POSITIONS } from '../geometry/index.js';
import { type Beam, type ControlPoint, note, type Note, type PatientPosition } from '../model/index.js';

/** Whether the beam geometry knows this patient position (IEC 61217 with its patient-support axes). */
export function isSupportedPosition(position: string | undefined): position is PatientPosition {
  return SUPPORTED_POSITIONS.includes(position as PatientPosition);
}

/**
 * Why the engine cannot yet give this beam an independent dose, as a coded note; undefined when it
 * can. No number is ever made up for such a beam.
 */
export function unsupportedReason(beam: Beam, patientPosition: string | undefined, mu: number | undefined): Note | undefined {
  if (beam.treatmentDeliveryType === 'SETUP') return note('setup-beam');
  if (beam.radiationType !== 'PHOTON' && beam.radiationType !== 'ELECTRON') return note('radiation-type', { type: beam.radiationType });
  if (beam.primaryDosimeterUnit === 'MINUTE') return note('meterset-in-minutes');
  if (mu === undefined || mu <= 0) return note('no-meterset');
  const cps = beam.controlPoints;
  if (beam.compensators.length) return note('compensator');
  if (beam.radiationType === 'ELECTRON' && isModulated(beam)) return note('electron-moves');
  const other = beam.wedges.find((w) => w.type && w.type !== 'STANDARD' && w.type !== 'DYNAMIC');
  if (other) return note('wedge-type', { type: other.type });
  const cp0 = cps[0]!;
  if ((cp0.tableTopEccentricAngleDeg ?? 0) !== 0) return note('table-eccentric');
  if (!patientPosition) return note('no-patient-position');
  if (!isSupportedPosition(patientPosition))
    return note('patient-position', { position: patientPosition, supported: SUPPORTED_POSITIONS.join(', ') });
  if (!cp0.isocenterPatientMm) return note('no-isocenter');
  if (cp0.nominalEnergyMeV === undefined) return note('no-energy');
  return undefined;
}

/**
 * Whether the beam changes during delivery (gantry, leaves, jaws): summed segment by segment. A
 * jaw-swept wedge is not: its jaw motion is the wedge, calculated by its factor over the full field.
 */
export function isModulated(beam: Beam): boolean {
  const cps = beam.controlPoints;
  if (beam.wedges.some((w) => w.type === 'DYNAMIC') && cps.every((c) => c.gantryAngleDeg === cps[0]!.gantryAngleDeg) && leavesStill(cps))
    return false;
  return beam.beamType === 'DYNAMIC' || cps.some((c) => c.gantryAngleDeg !== cps[0]!.gantryAngleDeg) || !sameAperture(cps);
}

function leavesStill(cps: readonly ControlPoint[]): boolean {
  const leaves = (c: ControlPoint) => JSON.stringify(c.devices.filter((d) => d.type === 'MLCX' || d.type === 'MLCY'));
  return cps.every((c) => leaves(c) === leaves(cps[0]!));
}

function sameAperture(cps: readonly ControlPoint[]): boolean {
  const first = JSON.stringify(cps[0]!.devices);
  const wedges = JSON.stringify(cps[0]!.wedgePositions);
  return cps.every(
    (c) =>
      JSON.stringify(c.devices) === first &&
      JSON.stringify(c.wedgePositions) === wedges &&
      c.collimatorAngleDeg === cps[0]!.collimatorAngleDeg &&
      c.couchAngleDeg === cps[0]!.couchAngleDeg,
  );
}
