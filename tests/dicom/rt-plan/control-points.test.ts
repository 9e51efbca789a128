/**
 * The Control Point Sequence resolved: after the first control point a plan sends only what changes
 * (PS3.3 C.8.8.14.5), so each control point carries every value in force; the SSD is not carried
 * (it belongs to its own gantry angle); an order, count or weight the standard forbids is refused.
 */
import { describe, expect, it } from 'vitest';
import { staticBeam } from '../../../scripts/fixtures/plan-parts.js';
import { imported, POINT, refused } from '../../helpers/plan-bytes.js';

const cps = (ds: any) => ds.BeamSequence[0].ControlPointSequence;

describe('control points', () => {
  it('the second control point carries gantry, collimator, couch, isocenter, energy and jaws from the first, but not the SSD', () => {
    const beam = imported(undefined, [staticBeam(1, 'LAT', 6, 90, 920, [10, 20, 30], { first: { collimatorDeg: 15, couchDeg: 350 } })]).plan
      .beams[0]!;
    const [cp0, cp1] = beam.controlPoints;
    expect(cp1).toMatchObject({
      gantryAngleDeg: 90,
      collimatorAngleDeg: 15,
      couchAngleDeg: 350,
      isocenterPatientMm: [10, 20, 30],
      nominalEnergyMeV: 6,
      cumulativeMetersetWeight: 1,
    });
    expect(cp1!.devices).toEqual(cp0!.devices);
    expect(cp0!.ssdMm).toBe(920);
    expect(cp1!.ssdMm).toBeUndefined();
  });
  it('an arc: each control point its own gantry angle, the rotation direction carried', () => {
    const arc = staticBeam(1, 'ARC', 6, 180, 900, POINT, { dynamic: true, first: { gantryDirection: 'CW' } });
    const beam = imported(undefined, [
      { ...arc, controlPoints: [arc.controlPoints[0]!, { weight: 0.5, gantryDeg: 270 }, { weight: 1, gantryDeg: 0 }] },
    ]).plan.beams[0]!;
    expect(beam.controlPoints.map((c) => [c.gantryAngleDeg, c.gantryRotation])).toEqual([
      [180, 'CW'],
      [270, 'CW'],
      [0, 'CW'],
    ]);
  });
  it('one control point is refused: a beam needs at least two', () => {
    const issues = refused((ds) => {
      ds.BeamSequence[0].ControlPointSequence = [cps(ds)[0]];
      ds.BeamSequence[0].NumberOfControlPoints = '1';
    });
    expect(issues.find((i) => i.path?.endsWith('ControlPointSequence'))).toMatchObject({ code: 'wrong-multiplicity', beamNumber: 1 });
  });
  it('a control point index out of order names the control point', () => {
    const issues = refused((ds) => (cps(ds)[1].ControlPointIndex = '5'));
    expect(issues[0]).toMatchObject({ code: 'inconsistent', controlPointIndex: 1, expected: '1', found: '5' });
  });
  it('a cumulative meterset weight that goes backwards is refused', () => {
    const issues = refused((ds) => {
      cps(ds)[0].CumulativeMetersetWeight = '0.5';
      cps(ds)[1].CumulativeMetersetWeight = '0.2';
    });
    expect(issues[0]).toMatchObject({ code: 'meterset-weight-decreasing', controlPointIndex: 1, found: '0.2' });
  });
  it('the first control point must state the gantry angle', () => {
    const issues = refused((ds) => delete cps(ds)[0].GantryAngle);
    expect(issues[0]).toMatchObject({ code: 'missing-attribute', controlPointIndex: 0 });
    expect(issues[0]!.path).toMatch(/GantryAngle$/);
  });
});
