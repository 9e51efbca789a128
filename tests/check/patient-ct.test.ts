/** The patient's CT as rays use it: its options, and the SSD along a beam's central axis (by hand from the box's faces). */
import { describe, expect, it } from 'vitest';
import { ctAxisSsdMm, ctDepthOptions } from '../../src/check/patient-ct.js';
import { beamFrame } from '../../src/geometry/index.js';
import { boxCt } from '../helpers/model-ct.js';
import { modelControlPoint } from '../helpers/model-beam.js';

const ct = boxCt({ halfMm: 100 });
const frame = (gantry: number) =>
  beamFrame({ ...modelControlPoint([-50, 50], [-50, 50]), gantryAngleDeg: gantry, isocenterPatientMm: [0, 0, 0] }, 'HFS', 1000)!;

describe('the patient CT', () => {
  it('rays take its threshold and densities (and no body outline unless one was given)', () => {
    const o = ctDepthOptions(ct);
    expect(o.bodyThresholdHu).toBe(-400);
    expect(o.density(-750)).toBeCloseTo(0.25, 12);
    expect(o.body).toBeUndefined();
  });
  it('the SSD along the central axis is SAD minus the distance to the face the beam meets (faces at ±102.5 mm)', () => {
    for (const g of [0, 90, 180, 270]) expect(ctAxisSsdMm(ct, frame(g), 1000)).toBeCloseTo(897.5, 6);
  });
  it('an axis that misses the body gives no SSD', () => {
    const off = beamFrame({ ...modelControlPoint([-50, 50], [-50, 50]), gantryAngleDeg: 0, isocenterPatientMm: [300, 0, 0] }, 'HFS', 1000)!;
    expect(ctAxisSsdMm(ct, off, 1000)).toBeUndefined();
  });
});
