import type { BeamLimitingDevice, ControlPoint, DevicePosition, RotationDirection, WedgePosition } from '../../model/index.js';
import { BeamLimitingDeviceType } from '../../model/index.js';
import { type ItemReader, need, oneOf } from '../item-reader.js';
import type { Keyword } from '../dictionary.js';

const ROTATIONS: readonly RotationDirection[] = ['CW', 'CC', 'NONE'];

/** Scalar control-point values carried forward from one control point to the next. */
const CARRIED_NUMBERS = [
  ['nominalEnergyMeV', 'NominalBeamEnergy'],
  ['doseRateSet', 'DoseRateSet'],
  ['gantryAngleDeg', 'GantryAngle'],
  ['collimatorAngleDeg', 'BeamLimitingDeviceAngle'],
  ['couchAngleDeg', 'PatientSupportAngle'],
  ['tableTopEccentricAxisDistanceMm', 'TableTopEccentricAxisDistance'],
  ['tableTopEccentricAngleDeg', 'TableTopEccentricAngle'],
  ['tableTopVerticalMm', 'TableTopVerticalPosition'],
  ['tableTopLongitudinalMm', 'TableTopLongitudinalPosition'],
  ['tableTopLateralMm', 'TableTopLateralPosition'],
  ['tableTopPitchDeg', 'TableTopPitchAngle'],
  ['tableTopRollDeg', 'TableTopRollAngle'],
] as const satisfies readonly (readonly [keyof ControlPoint, Keyword])[];

const CARRIED_ROTATIONS = [
  ['gantryRotation', 'GantryRotationDirection'],
  ['collimatorRotation', 'BeamLimitingDeviceRotationDirection'],
  ['couchRotation', 'PatientSupportRotationDirection'],
  ['tableTopEccentricRotation', 'TableTopEccentricRotationDirection'],
] as const satisfies readonly (readonly [keyof ControlPoint, Keyword])[];

/** Required at the first control point (type 1C "required for the first item"), as an error when absent. */
const REQUIRED_AT_FIRST: readonly (readonly [Keyword, string])[] = [
  ['NominalBeamEnergy', 'the nominal beam energy (MeV)'],
  ['GantryAngle', 'the gantry angle (degrees)'],
  ['BeamLimitingDeviceAngle', 'the collimator angle (degrees)'],
  ['PatientSupportAngle', 'the patient support (couch) angle (degrees)'],
];

export interface BeamContext {
  readonly devices: readonly BeamLimitingDevice[];
  readonly wedgeNumbers: ReadonlySet<number>;
  /** Setup beams carry no meterset, so their control points may omit the meterset weight. */
  readonly isSetupBeam: boolean;
}

/**
 * Reads the Control Point Sequence and resolves it: after the first control point DICOM sends only
 * what changes (PS3.3 C.8.8.14.5), so each returned control point carries every value in force.
 */
export function readControlPoints(beam: ItemReader, ctx: BeamContext): ControlPoint[] | undefined {
  const items = beam.sequence('ControlPointSequence');
  if (items.length < 2) {
    beam.report(
      'error',
      items.length === 0 ? 'missing-attribute' : 'wrong-multiplicity',
      'ControlPointSequence',
      'must hold at least two control points',
      'at least 2 items',
      `${items.length}`,
    );
    return undefined;
  }
  const out: ControlPoint[] = [];
  let prev: ControlPoint | undefined;
  let ok = true;
  for (let i = 0; i < items.length; i++) {
    const cp = items[i]!.within({ controlPointIndex: i });
    const cpOk = readOne(cp, i, prev, ctx);
    if (!cpOk) {
      ok = false;
      continue;
    }
    out.push(cpOk);
    prev = cpOk;
  }
  return ok ? out : undefined;
}

function readOne(cp: ItemReader, i: number, prev: ControlPoint | undefined, ctx: BeamContext): ControlPoint | undefined {
  let ok = true;
  const index = need(cp, 'ControlPointIndex', cp.integer('ControlPointIndex'), `control point index ${i}`);
  if (index !== undefined && index !== i) {
    cp.report('error', 'inconsistent', 'ControlPointIndex', 'does not follow the sequence order', `${i}`, `${index}`);
    ok = false;
  }
  if (i === 0) {
    for (const [kw, what] of REQUIRED_AT_FIRST) if (need(cp, kw, cp.number(kw), what) === undefined) ok = false;
  }

  const values: Record<string, unknown> = {};
  for (const [field, kw] of CARRIED_NUMBERS) {
    const v = cp.number(kw);
    const carried = v ?? prev?.[field];
    if (carried !== undefined) values[field] = carried;
  }
  for (const [field, kw] of CARRIED_ROTATIONS) {
    const v = oneOf(cp, kw, ROTATIONS) ?? prev?.[field];
    if (v !== undefined) values[field] = v;
  }
  const isoHere = cp.tuple('IsocenterPosition', 3);
  // Type 2C at the first control point: it may be empty (a warning); a present value must be readable.
  if (i === 0) need(cp, 'IsocenterPosition', isoHere, 'the isocenter (x, y, z) in mm', 'warning');
  const iso = isoHere ?? prev?.isocenterPatientMm;
  // SSD and entry point belong to their control point alone: they follow from its gantry angle and
  // the patient's contour, so a value carried from another angle would be a wrong depth.
  const entry = cp.tuple('SurfaceEntryPoint', 3);
  const ssdMm = cp.number('SourceToSurfaceDistance');

  let cmw = cp.number('CumulativeMetersetWeight');
  if (cmw === undefined) {
    if (ctx.isSetupBeam) cmw = prev?.cumulativeMetersetWeight ?? 0;
    else {
      need(cp, 'CumulativeMetersetWeight', cmw, 'the cumulative meterset weight');
      ok = false;
    }
  } else if (!Number.isFinite(cmw) || cmw < 0) {
    cp.report('error', 'invalid-value', 'CumulativeMetersetWeight', 'is negative', 'a value >= 0', `${cmw}`);
    ok = false;
  } else if (prev && cmw < prev.cumulativeMetersetWeight) {
    cp.report(
      'error',
      'meterset-weight-decreasing',
      'CumulativeMetersetWeight',
      'goes backwards',
      `>= ${prev.cumulativeMetersetWeight} (control point ${i - 1})`,
      `${cmw}`,
    );
    ok = false;
  }

  const devices = readDevicePositions(cp, i, prev, ctx);
  if (!devices) ok = false;
  const wedgePositions = readWedgePositions(cp, prev, ctx);
  if (!wedgePositions) ok = false;

  const doseReferenceCoefficients = cp.sequence('ReferencedDoseReferenceSequence').map((r) => {
    const n = need(r, 'ReferencedDoseReferenceNumber', r.integer('ReferencedDoseReferenceNumber'), 'a dose reference number');
    const c = r.number('CumulativeDoseReferenceCoefficient');
    return { doseReferenceNumber: n ?? -1, ...(c !== undefined ? { cumulativeCoefficient: c } : {}) };
  });

  if (!ok || values.gantryAngleDeg === undefined || values.collimatorAngleDeg === undefined || values.couchAngleDeg === undefined) {
    return undefined;
  }
  return {
    index: i,
    ...values,
    ...(iso ? { isocenterPatientMm: iso as [number, number, number] } : {}),
    ...(entry ? { surfaceEntryPointPatientMm: entry as [number, number, number] } : {}),
    ...(ssdMm !== undefined ? { ssdMm } : {}),
    cumulativeMetersetWeight: cmw!,
    devices: devices!,
    wedgePositions: wedgePositions!,
    doseReferenceCoefficients,
  } as unknown as ControlPoint;
}

function readDevicePositions(cp: ItemReader, i: number, prev: ControlPoint | undefined, ctx: BeamContext): DevicePosition[] | undefined {
  const given = new Map<string, number[]>();
  const unreadable = new Set<string>();
  let ok = true;
  for (const d of cp.sequence('BeamLimitingDevicePositionSequence')) {
    const type = oneOf(d, 'RTBeamLimitingDeviceType', BeamLimitingDeviceType.options);
    const declared = ctx.devices.find((x) => x.type === type);
    if (!type) {
      need(d, 'RTBeamLimitingDeviceType', type, 'X, Y, ASYMX, ASYMY, MLCX or MLCY');
      ok = false;
      continue;
    }
    if (!declared) {
      d.report(
        'error',
        'unknown-reference',
        'RTBeamLimitingDeviceType',
        'names a device the beam does not declare in its Beam Limiting Device Sequence',
        ctx.devices.map((x) => x.type).join(', ') || 'no devices',
        type,
      );
      ok = false;
      continue;
    }
    const positions = need(
      d,
      'LeafJawPositions',
      d.tuple('LeafJawPositions', 2 * declared.numberOfPairs),
      `${2 * declared.numberOfPairs} positions (mm) for ${declared.numberOfPairs} pair(s)`,
    );
    if (!positions) {
      unreadable.add(type);
      ok = false;
      continue;
    }
    if (given.has(type)) {
      d.report('error', 'duplicate', 'RTBeamLimitingDeviceType', 'is given twice at this control point', 'one entry per device', type);
      ok = false;
    }
    const n = declared.numberOfPairs;
    for (let k = 0; k < n; k++) {
      const a = positions[k]!;
      const b = positions[k + n]!;
      if (a > b) {
        const jaw = type === 'X' || type === 'Y' || type === 'ASYMX' || type === 'ASYMY';
        d.report(
          'error',
          jaw ? 'jaws-crossed' : 'leaves-crossed',
          'LeafJawPositions',
          jaw
            ? `jaws cross: ${type}1 = ${a} mm lies beyond ${type}2 = ${b} mm`
            : `leaf pair ${k + 1} crosses: bank 1 at ${a} mm lies beyond bank 2 at ${b} mm`,
          jaw ? `${type}1 <= ${type}2` : 'bank 1 <= bank 2',
          `${a} > ${b}`,
        );
        ok = false;
        break;
      }
    }
    given.set(type, positions);
  }
  const out: DevicePosition[] = [];
  for (const dev of ctx.devices) {
    const positions = given.get(dev.type) ?? prev?.devices.find((p) => p.type === dev.type)?.positionsMm;
    if (!positions) {
      if (i === 0 && !unreadable.has(dev.type)) {
        cp.report(
          'error',
          'missing-attribute',
          'BeamLimitingDevicePositionSequence',
          `gives no positions for the ${dev.type} device at the first control point`,
          `positions for ${dev.type}`,
        );
        ok = false;
      }
      continue;
    }
    out.push({ type: dev.type, positionsMm: positions });
  }
  return ok ? out : undefined;
}

function readWedgePositions(cp: ItemReader, prev: ControlPoint | undefined, ctx: BeamContext): WedgePosition[] | undefined {
  const byNumber = new Map<number, WedgePosition>((prev?.wedgePositions ?? []).map((w) => [w.wedgeNumber, w]));
  let ok = true;
  for (const w of cp.sequence('WedgePositionSequence')) {
    const n = need(w, 'ReferencedWedgeNumber', w.integer('ReferencedWedgeNumber'), 'the number of a wedge of this beam');
    const pos = need(w, 'WedgePosition', oneOf(w, 'WedgePosition', ['IN', 'OUT'] as const), 'IN or OUT');
    if (n === undefined || pos === undefined) {
      ok = false;
      continue;
    }
    if (!ctx.wedgeNumbers.has(n)) {
      w.report(
        'error',
        'unknown-reference',
        'ReferencedWedgeNumber',
        'names a wedge the beam does not have',
        [...ctx.wedgeNumbers].join(', ') || 'no wedges',
        `${n}`,
      );
      ok = false;
      continue;
    }
    byNumber.set(n, { wedgeNumber: n, position: pos });
  }
  return ok ? [...byNumber.values()] : undefined;
}
