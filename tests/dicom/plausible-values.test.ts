/**
 * Values no planning system writes are input errors naming the attribute, never numbers to compute
 * with. The ranges: angles as the standard defines them (0 <= angle < 360, PS3.3 C.8.8.14); the
 * other bounds are far beyond any external-beam treatment (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { importPlanFile } from '../../src/dicom/index.js';
import { isPlausible, PLAUSIBLE } from '../../src/dicom/plausible-values.js';
import { writeVariant } from '../helpers/plan-variants.js';

const errorsOf = (file: string) => {
  const r = importPlanFile(file);
  return r.ok ? [] : r.issues.filter((i) => i.severity === 'error');
};

const cp0 = (ds: any, beam = 0) => ds.BeamSequence[beam].ControlPointSequence[0];
const rb = (ds: any, beam = 0) => ds.FractionGroupSequence[0].ReferencedBeamSequence[beam];

describe('values outside what a treatment plan can hold are refused', () => {
  const cases: [string, string, (ds: any) => void, string][] = [
    ['a gantry of 1e9', 'four-field-box.dcm', (ds) => (cp0(ds).GantryAngle = 1e9), 'GantryAngle'],
    ['a gantry of 720.5', 'four-field-box.dcm', (ds) => (cp0(ds).GantryAngle = 720.5), 'GantryAngle'],
    ['a gantry of 360 (written 0)', 'four-field-box.dcm', (ds) => (cp0(ds).GantryAngle = 360), 'GantryAngle'],
    ['a collimator of 1e300', 'four-field-box.dcm', (ds) => (cp0(ds).BeamLimitingDeviceAngle = 1e300), 'BeamLimitingDeviceAngle'],
    ['a couch of −5', 'four-field-box.dcm', (ds) => (cp0(ds).PatientSupportAngle = -5), 'PatientSupportAngle'],
    [
      'a gantry of 1e6 at one control point of an arc',
      'two-arc-vmat.dcm',
      (ds) => (ds.BeamSequence[0].ControlPointSequence[7].GantryAngle = 1e6),
      'GantryAngle',
    ],
    [
      'a prescription of −100 Gy',
      'four-field-box.dcm',
      (ds) => (ds.DoseReferenceSequence[0].TargetPrescriptionDose = -100),
      'TargetPrescriptionDose',
    ],
    [
      'a prescription of 1e300 Gy',
      'four-field-box.dcm',
      (ds) => (ds.DoseReferenceSequence[0].TargetPrescriptionDose = 1e300),
      'TargetPrescriptionDose',
    ],
    ['a prescription of 0 Gy', 'four-field-box.dcm', (ds) => (ds.DoseReferenceSequence[0].TargetPrescriptionDose = 0), 'TargetPrescriptionDose'],
    ['a wedge angle of −100', 'wedged-pair.dcm', (ds) => (ds.BeamSequence[0].WedgeSequence[0].WedgeAngle = -100), 'WedgeAngle'],
    ['MU of 1e300', 'four-field-box.dcm', (ds) => (rb(ds).BeamMeterset = 1e300), 'BeamMeterset'],
    ['a Beam Dose of −100 Gy', 'four-field-box.dcm', (ds) => (rb(ds).BeamDose = -100), 'BeamDose'],
    ['0 fractions planned', 'four-field-box.dcm', (ds) => (ds.FractionGroupSequence[0].NumberOfFractionsPlanned = 0), 'NumberOfFractionsPlanned'],
    [
      'X jaws at ±1e6 mm',
      'four-field-box.dcm',
      (ds) => (cp0(ds).BeamLimitingDevicePositionSequence[0].LeafJawPositions = [-1e6, 1e6]),
      'LeafJawPositions',
    ],
    ['an isocenter 1e9 mm away', 'four-field-box.dcm', (ds) => (cp0(ds).IsocenterPosition = [0, 1e9, 0]), 'IsocenterPosition'],
    ['an SSD of −900 mm', 'four-field-box.dcm', (ds) => (cp0(ds).SourceToSurfaceDistance = -900), 'SourceToSurfaceDistance'],
  ];
  for (const [what, file, mutate, keyword] of cases) {
    it(what, () => {
      const errors = errorsOf(writeVariant(file, mutate));
      expect(errors.map((i) => i.code)).toEqual(['physical-range']);
      expect(errors[0]!.path).toMatch(new RegExp(`\\.${keyword}$|^${keyword}$`));
    });
  }
});

describe('blank coded strings are errors naming the attribute, never a beam dropped unsaid', () => {
  const cases: [string, string, (ds: any) => void, string][] = [
    ['RadiationType of NULs', 'four-field-box.dcm', (ds) => (ds.BeamSequence[0].RadiationType = '\0\0'), 'RadiationType'],
    ['BeamType of spaces', 'four-field-box.dcm', (ds) => (ds.BeamSequence[0].BeamType = '  '), 'BeamType'],
    ['WedgePosition blank', 'wedged-pair.dcm', (ds) => (cp0(ds).WedgePositionSequence[0].WedgePosition = ' '), 'WedgePosition'],
    [
      'a device type blank at a later control point',
      'two-arc-vmat.dcm',
      (ds) => (ds.BeamSequence[0].ControlPointSequence[5].BeamLimitingDevicePositionSequence[0].RTBeamLimitingDeviceType = '\0'),
      'RTBeamLimitingDeviceType',
    ],
  ];
  for (const [what, file, mutate, keyword] of cases) {
    it(what, () => {
      const errors = errorsOf(writeVariant(file, mutate));
      expect(errors.map((i) => [i.code, i.path?.split('.').pop()])).toEqual([['empty-attribute', keyword]]);
    });
  }
});

describe('the ranges themselves', () => {
  it('angles: 0 and 359.9 in, 360 and −0.1 out (the standard writes 360 as 0)', () => {
    const a = PLAUSIBLE.GantryAngle!;
    expect([0, 359.9, 360, -0.1].map((v) => isPlausible(v, a))).toEqual([true, true, false, false]);
  });
  it('nothing non-finite is plausible', () => {
    for (const p of Object.values(PLAUSIBLE)) expect([Number.NaN, Infinity, -Infinity].some((v) => isPlausible(v, p!))).toBe(false);
  });
  it('the demo plans, written as a planning system would, are all inside', () => {
    for (const f of ['four-field-box.dcm', 'two-arc-vmat.dcm', 'wedged-pair.dcm', 'electron-applicator.dcm', 'two-phase.dcm', 'mlc-conformal.dcm'])
      expect(errorsOf(writeVariant(f, () => {}))).toEqual([]);
  });
});
