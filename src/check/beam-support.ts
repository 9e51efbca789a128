import type { Beam, ControlPoint } from '../model/index.js';

const POSITIONS_SUPPORTED = new Set(['HFS', 'HFP', 'FFS', 'FFP']);

/**
 * Why the engine cannot yet give this beam an independent dose, in words; undefined when it can.
 * No number is ever made up for such a beam.
 */
export function unsupportedReason(beam: Beam, patientPosition: string | undefined, mu: number | undefined): string | undefined {
  if (beam.treatmentDeliveryType === 'SETUP') return 'a setup beam, not a treatment beam';
  if (beam.radiationType !== 'PHOTON' && beam.radiationType !== 'ELECTRON') return `${beam.radiationType.toLowerCase()} beams are outside what plumbline checks`;
  if (beam.primaryDosimeterUnit === 'MINUTE') return 'the meterset is in minutes, not MU';
  if (mu === undefined || mu <= 0) return 'the beam has no meterset';
  const cps = beam.controlPoints;
  if (beam.compensators.length) return 'a compensator is in the beam';
  if (beam.radiationType === 'ELECTRON' && isModulated(beam)) return 'an electron beam that moves or changes its field during delivery: not supported';
  const other = beam.wedges.find((w) => w.type && w.type !== 'STANDARD' && w.type !== 'DYNAMIC');
  if (other) return `a ${other.type!.toLowerCase()} wedge: physical and jaw-swept (dynamic) wedges are checked, this type is not`;
  const cp0 = cps[0]!;
  if ((cp0.tableTopEccentricAngleDeg ?? 0) !== 0) return 'the table top eccentric angle is not 0 (not supported)';
  if (!patientPosition) return 'the patient position is not given';
  if (!POSITIONS_SUPPORTED.has(patientPosition)) return `patient position ${patientPosition}: the beam geometry supports HFS, HFP, FFS and FFP so far`;
  if (!cp0.isocenterPatientMm) return 'the first control point has no isocenter';
  if (cp0.nominalEnergyMeV === undefined) return 'no nominal energy';
  return undefined;
}

/**
 * Whether the beam changes during delivery (gantry, leaves, jaws): summed segment by segment. A
 * jaw-swept wedge is not: its jaw motion is the wedge, calculated by its factor over the full field.
 */
export function isModulated(beam: Beam): boolean {
  const cps = beam.controlPoints;
  if (beam.wedges.some((w) => w.type === 'DYNAMIC') && cps.every((c) => c.gantryAngleDeg === cps[0]!.gantryAngleDeg) && leavesStill(cps)) return false;
  return beam.beamType === 'DYNAMIC' || cps.some((c) => c.gantryAngleDeg !== cps[0]!.gantryAngleDeg) || !sameAperture(cps);
}

function leavesStill(cps: readonly ControlPoint[]): boolean {
  const leaves = (c: ControlPoint) => JSON.stringify(c.devices.filter((d) => d.type === 'MLCX' || d.type === 'MLCY'));
  return cps.every((c) => leaves(c) === leaves(cps[0]!));
}

function sameAperture(cps: readonly ControlPoint[]): boolean {
  const first = JSON.stringify(cps[0]!.devices);
  const wedges = JSON.stringify(cps[0]!.wedgePositions);
  return cps.every((c) => JSON.stringify(c.devices) === first && JSON.stringify(c.wedgePositions) === wedges && c.collimatorAngleDeg === cps[0]!.collimatorAngleDeg && c.couchAngleDeg === cps[0]!.couchAngleDeg);
}
