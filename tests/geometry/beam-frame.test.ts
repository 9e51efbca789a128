/**
 * IEC 61217 conventions as DICOM uses them, pinned by cases whose answers follow from the
 * definitions: DICOM patient axes +x left, +y posterior, +z head (PS3.3 C.7.6.2.1.1); at gantry 0 the
 * source is above the isocenter and gantry angles increase clockwise seen from the couch foot, so
 * gantry 90 puts the source on the +X side of the fixed frame (common practice, no source beyond the
 * standard's axis definitions; the signs of the rotations are from memory and derivation).
 */
import { describe, expect, it } from 'vitest';
import { beamFrame, flatDepth, patientToBld, bldToPatient } from '../../src/geometry/index.js';
import type { PatientPosition } from '../../src/model/index.js';
import { anglesControlPoint } from '../helpers/model-beam.js';

const cp = anglesControlPoint;
const source = (pos: PatientPosition, g: number, c = 0, t = 0) => {
  const f = beamFrame(cp(g, c, t), pos, 1000);
  if (!f) throw new Error('unsupported');
  return f.sourcePatientMm.map((v) => Math.round(v) + 0);
};

describe('source position in patient coordinates', () => {
  it('HFS, gantry 0: the source is anterior (an AP beam enters the front)', () => expect(source('HFS', 0)).toEqual([0, -1000, 0]));
  it("HFS, gantry 90: the source is at the patient's left", () => expect(source('HFS', 90)).toEqual([1000, 0, 0]));
  it("HFS, gantry 270: the source is at the patient's right", () => expect(source('HFS', 270)).toEqual([-1000, 0, 0]));
  it('HFS, gantry 180: posterior', () => expect(source('HFS', 180)).toEqual([0, 1000, 0]));
  it('HFP, gantry 0: the source above a prone patient is posterior', () => expect(source('HFP', 0)).toEqual([0, 1000, 0]));
  it("FFS, gantry 90: feet first flips the sides: the patient's right", () => expect(source('FFS', 90)).toEqual([-1000, 0, 0]));
  it("FFP, gantry 90: prone and feet first: the patient's left", () => expect(source('FFP', 90)).toEqual([1000, 0, 0]));
  it('HFS, gantry 90, couch 90: the couch foot swings towards the source, which is then inferior', () =>
    expect(source('HFS', 90, 0, 90)).toEqual([0, 0, -1000]));
  it('decubitus positions are refused, not guessed', () => expect(beamFrame(cp(0), 'HFDL', 1000)).toBeUndefined());
});

describe('beam-limiting-device axes', () => {
  it('HFS, gantry 0, collimator 90: Xb points to the head (+z) and Yb to the right (−x)', () => {
    const f = beamFrame(cp(0, 90), 'HFS', 1000)!;
    expect(bldToPatient(f, [1, 0, 0]).map((v) => Math.round(v) + 0)).toEqual([0, 0, 1]);
    expect(bldToPatient(f, [0, 1, 0]).map((v) => Math.round(v) + 0)).toEqual([-1, 0, 0]);
  });
  it('maps there and back exactly, with a rotation (lengths kept)', () => {
    const f = beamFrame(cp(37, 15, 350, [12, -40, 5]), 'FFS', 1000)!;
    const p: [number, number, number] = [30, 20, -10];
    const back = bldToPatient(f, patientToBld(f, p));
    back.forEach((v, i) => expect(v).toBeCloseTo(p[i]!, 10));
    const b = patientToBld(f, [12 + 3, -40 + 4, 5]);
    expect(Math.hypot(...b)).toBeCloseTo(5, 12);
  });
});

describe('depth below a flat surface', () => {
  it('HFS AP beam, SSD 900: the isocenter is 100 mm deep; a point 50 mm posterior and 30 mm left is 150 mm deep, 30 mm off axis', () => {
    const f = beamFrame(cp(0), 'HFS', 1000)!;
    expect(flatDepth(f, [0, 0, 0], 900).depthMm).toBeCloseTo(100, 10);
    const d = flatDepth(f, [30, 50, 0], 900);
    expect(d.depthMm).toBeCloseTo(150, 10);
    expect(d.offAxisMm).toBeCloseTo(30, 10);
    expect(d.atIsocenterPlaneMm[0]).toBeCloseTo((30 * 1000) / 1050, 10);
  });
});
