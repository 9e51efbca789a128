import type { Beam, BeamDoseVerification, BeamLimitingDevice, Block, Wedge } from '../../model/index.js';
import { BeamLimitingDeviceType, RadiationType } from '../../model/index.js';
import { type ItemReader, need, oneOf } from '../item-reader.js';
import { readControlPoints } from './control-points.js';
import { opt } from './optional.js';

const SETUP_DELIVERY_TYPE = 'SETUP';

/** Reads one item of the Beam Sequence; undefined when it cannot be read faithfully (issues say why). */
export function readBeam(item: ItemReader): Beam | undefined {
  const number = need(item, 'BeamNumber', item.integer('BeamNumber'), 'the beam number');
  const name = item.string('BeamName');
  const b = item.within({ ...(number !== undefined ? { beamNumber: number } : {}), ...(name ? { beamName: name } : {}) });

  const radiationType = need(b, 'RadiationType', oneOf(b, 'RadiationType', RadiationType.options), 'PHOTON, ELECTRON, NEUTRON, PROTON or ION');
  const beamType = need(b, 'BeamType', oneOf(b, 'BeamType', ['STATIC', 'DYNAMIC'] as const), 'STATIC or DYNAMIC');
  const deliveryType = b.string('TreatmentDeliveryType');
  const primaryDosimeterUnit = oneOf(b, 'PrimaryDosimeterUnit', ['MU', 'MINUTE'] as const);
  const sad = b.number('SourceAxisDistance');
  if (sad !== undefined && sad <= 0) b.report('error', 'invalid-value', 'SourceAxisDistance', 'is not positive', 'a distance > 0 mm', `${sad}`);

  const limitingDevices = readDevices(b);
  const wedges = b.sequence('WedgeSequence').map(readWedge);
  checkUnique(
    b,
    'WedgeSequence',
    wedges.map((w) => w.number),
    'wedge number',
  );
  const blocks = b
    .sequence('BlockSequence')
    .map(readBlock)
    .filter((x): x is Block => x !== undefined);
  const finalWeight = b.number('FinalCumulativeMetersetWeight');
  const isSetupBeam = deliveryType === SETUP_DELIVERY_TYPE;

  countMatches(b, 'NumberOfWedges', wedges.length, 'WedgeSequence');
  countMatches(b, 'NumberOfBlocks', blocks.length, 'BlockSequence');
  countMatches(b, 'NumberOfCompensators', b.sequence('CompensatorSequence').length, 'CompensatorSequence');
  countMatches(b, 'NumberOfBoli', b.sequence('ReferencedBolusSequence').length, 'ReferencedBolusSequence');

  const controlPoints = readControlPoints(b, {
    devices: limitingDevices,
    wedgeNumbers: new Set(wedges.map((w) => w.number)),
    isSetupBeam,
  });
  if (controlPoints) {
    countMatches(b, 'NumberOfControlPoints', controlPoints.length, 'ControlPointSequence');
    const last = controlPoints[controlPoints.length - 1]!.cumulativeMetersetWeight;
    if (finalWeight !== undefined && Math.abs(last - finalWeight) > 1e-6 * Math.max(1, Math.abs(finalWeight))) {
      b.report(
        'error',
        'inconsistent',
        'FinalCumulativeMetersetWeight',
        "differs from the last control point's Cumulative Meterset Weight",
        `${last}`,
        `${finalWeight}`,
      );
    }
  }
  if (number === undefined || radiationType === undefined || beamType === undefined || !controlPoints) return undefined;
  return {
    number,
    ...opt('name', name),
    ...opt('description', b.string('BeamDescription')),
    ...opt('machineName', b.string('TreatmentMachineName')),
    ...opt('manufacturer', b.string('Manufacturer')),
    ...opt('manufacturerModelName', b.string('ManufacturerModelName')),
    ...opt('deviceSerialNumber', b.string('DeviceSerialNumber')),
    radiationType,
    beamType,
    ...opt('treatmentDeliveryType', deliveryType),
    ...opt('primaryDosimeterUnit', primaryDosimeterUnit),
    ...opt('sourceAxisDistanceMm', sad),
    ...opt('patientSetupNumber', b.integer('ReferencedPatientSetupNumber')),
    ...opt('finalCumulativeMetersetWeight', finalWeight),
    limitingDevices,
    wedges,
    compensators: b.sequence('CompensatorSequence').map((c) => ({
      ...opt('number', c.integer('CompensatorNumber')),
      ...opt('type', c.string('CompensatorType')),
      ...opt('id', c.string('CompensatorID')),
      ...opt('materialId', c.string('MaterialID')),
      ...opt('rows', c.integer('CompensatorRows')),
      ...opt('columns', c.integer('CompensatorColumns')),
      ...opt('sourceToTrayDistanceMm', c.number('SourceToCompensatorTrayDistance')),
    })),
    bolusRoiNumbers: b
      .sequence('ReferencedBolusSequence')
      .map((x) => need(x, 'ReferencedROINumber', x.integer('ReferencedROINumber'), 'the bolus ROI number'))
      .filter((n): n is number => n !== undefined),
    blocks,
    ...opt('totalBlockTrayFactor', b.number('TotalBlockTrayFactor')),
    applicators: b.sequence('ApplicatorSequence').map((a) => ({
      id: need(a, 'ApplicatorID', a.string('ApplicatorID'), 'the applicator ID') ?? '',
      type: need(a, 'ApplicatorType', a.string('ApplicatorType'), 'the applicator type') ?? '',
      ...opt('description', a.string('ApplicatorDescription')),
    })),
    doseVerification: readDoseVerification(b),
    controlPoints,
  };
}

function readDevices(b: ItemReader): BeamLimitingDevice[] {
  const out: BeamLimitingDevice[] = [];
  for (const d of b.sequence('BeamLimitingDeviceSequence')) {
    const type = need(
      d,
      'RTBeamLimitingDeviceType',
      oneOf(d, 'RTBeamLimitingDeviceType', BeamLimitingDeviceType.options),
      'X, Y, ASYMX, ASYMY, MLCX or MLCY',
    );
    const pairs = need(d, 'NumberOfLeafJawPairs', d.integer('NumberOfLeafJawPairs'), 'the number of leaf or jaw pairs');
    if (type === undefined || pairs === undefined) continue;
    if (pairs < 1) {
      d.report('error', 'invalid-value', 'NumberOfLeafJawPairs', 'is not positive', '>= 1', `${pairs}`);
      continue;
    }
    const isMlc = type === 'MLCX' || type === 'MLCY';
    if (!isMlc && pairs !== 1) d.report('error', 'invalid-value', 'NumberOfLeafJawPairs', `must be 1 for ${type} jaws`, '1', `${pairs}`);
    const boundaries = d.numbers('LeafPositionBoundaries');
    if (isMlc) {
      need(d, 'LeafPositionBoundaries', boundaries, `${pairs + 1} leaf boundaries (mm)`);
      if (boundaries && boundaries.length !== pairs + 1) {
        d.report(
          'error',
          'wrong-multiplicity',
          'LeafPositionBoundaries',
          'does not match the number of leaf pairs',
          `${pairs + 1} values`,
          `${boundaries.length}`,
        );
      } else if (boundaries?.some((v, i) => i > 0 && v <= boundaries[i - 1]!)) {
        d.report('error', 'invalid-value', 'LeafPositionBoundaries', 'are not strictly increasing', 'increasing boundaries', boundaries.join('\\'));
      }
    }
    if (out.some((x) => x.type === type)) {
      d.report('error', 'duplicate', 'RTBeamLimitingDeviceType', 'is declared twice', 'one entry per device', type);
      continue;
    }
    const sdd = d.number('SourceToBeamLimitingDeviceDistance');
    out.push({
      type,
      numberOfPairs: pairs,
      ...(isMlc && boundaries ? { leafBoundariesMm: boundaries } : {}),
      ...(sdd !== undefined ? { sourceToDeviceDistanceMm: sdd } : {}),
    });
  }
  return out;
}

function readWedge(w: ItemReader): Wedge {
  return {
    number: need(w, 'WedgeNumber', w.integer('WedgeNumber'), 'the wedge number') ?? -1,
    ...opt('type', w.string('WedgeType')),
    ...opt('id', w.string('WedgeID')),
    ...opt('angleDeg', w.number('WedgeAngle')),
    ...opt('factor', w.number('WedgeFactor')),
    ...opt('orientationDeg', w.number('WedgeOrientation')),
    ...opt('sourceToWedgeTrayDistanceMm', w.number('SourceToWedgeTrayDistance')),
    ...opt('effectiveAngleDeg', w.number('EffectiveWedgeAngle')),
  };
}

function readBlock(k: ItemReader): Block | undefined {
  const number = need(k, 'BlockNumber', k.integer('BlockNumber'), 'the block number');
  const type = need(k, 'BlockType', oneOf(k, 'BlockType', ['SHIELDING', 'APERTURE'] as const), 'SHIELDING or APERTURE');
  const n = need(k, 'BlockNumberOfPoints', k.integer('BlockNumberOfPoints'), 'the number of outline points');
  const data = n === undefined ? undefined : need(k, 'BlockData', k.tuple('BlockData', 2 * n), `${2 * n} values (x, y pairs in mm)`);
  if (n !== undefined && n < 3) k.report('error', 'invalid-value', 'BlockNumberOfPoints', 'is too small for an outline', '>= 3', `${n}`);
  if (number === undefined || type === undefined || !data) return undefined;
  const outlineMm: [number, number][] = [];
  for (let i = 0; i < data.length; i += 2) outlineMm.push([data[i]!, data[i + 1]!]);
  return {
    number,
    ...opt('name', k.string('BlockName')),
    ...opt('trayId', k.string('BlockTrayID')),
    ...opt('sourceToTrayDistanceMm', k.number('SourceToBlockTrayDistance')),
    type,
    ...opt('divergence', oneOf(k, 'BlockDivergence', ['PRESENT', 'ABSENT'] as const)),
    ...opt('mountingPosition', k.string('BlockMountingPosition')),
    ...opt('materialId', k.string('MaterialID')),
    ...opt('thicknessMm', k.number('BlockThickness')),
    ...opt('transmission', k.number('BlockTransmission')),
    outlineMm,
  };
}

/** Beam > Referenced Dose Reference Sequence > Beam Dose Verification Control Point Sequence. */
function readDoseVerification(b: ItemReader): BeamDoseVerification[] {
  return b.sequence('ReferencedDoseReferenceSequence').map((r) => {
    const flag = oneOf(r, 'DepthValueAveragingFlag', ['YES', 'NO'] as const);
    return {
      doseReferenceNumber: need(r, 'ReferencedDoseReferenceNumber', r.integer('ReferencedDoseReferenceNumber'), 'a dose reference number') ?? -1,
      ...(flag ? { depthValueAveraging: flag === 'YES' } : {}),
      points: r.sequence('BeamDoseVerificationControlPointSequence').map((p) => ({
        ...opt('cumulativeMetersetWeight', p.number('CumulativeMetersetWeight')),
        ...opt('controlPointIndex', p.integer('ReferencedControlPointIndex')),
        ...opt('pointDepthMm', p.number('BeamDosePointDepth')),
        ...opt('equivalentDepthMm', p.number('BeamDosePointEquivalentDepth')),
        ...opt('ssdMm', p.number('BeamDosePointSSD')),
        ...opt('sourceToExternalContourMm', p.number('BeamDosePointSourceToExternalContourDistance')),
      })),
    };
  });
}

function countMatches(
  b: ItemReader,
  kw: 'NumberOfWedges' | 'NumberOfBlocks' | 'NumberOfCompensators' | 'NumberOfBoli' | 'NumberOfControlPoints',
  actual: number,
  seq: string,
): void {
  const declared = b.integer(kw);
  if (declared !== undefined && declared !== actual) {
    b.report('error', 'inconsistent', kw, `does not match the ${seq}`, `${actual} (items present)`, `${declared}`);
  }
}

export function checkUnique(r: ItemReader, kw: Parameters<ItemReader['report']>[2], numbers: readonly number[], what: string): void {
  const seen = new Set<number>();
  for (const n of numbers) {
    if (seen.has(n)) r.report('error', 'duplicate', kw, `has the ${what} ${n} more than once`, `unique ${what}s`, `${n}`);
    seen.add(n);
  }
}
