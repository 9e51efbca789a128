/**
 * One item of the Beam Sequence read: its modifiers (wedge, block, applicator, limiting devices) as
 * stated, and the counts and terms the standard defines (PS3.3 C.8.8.14) checked against what the
 * item holds. Invented values.
 */
import { describe, expect, it } from 'vitest';
import { MLC_PAIRS, staticBeam } from '../../../scripts/fixtures/plan-parts.js';
import { imported, POINT, refused } from '../../helpers/plan-bytes.js';

const beam0 = (ds: any) => ds.BeamSequence[0];

describe('a beam item', () => {
  it('a wedge, a block and an MLC read as stated', () => {
    const b = imported(undefined, [
      staticBeam(1, 'LAT W30', 6, 90, 900, POINT, {
        mlc: true,
        first: { leaves: [...Array(MLC_PAIRS).fill(-50), ...Array(MLC_PAIRS).fill(50)] },
        wedge: { id: 'W30', angle: 30, factor: 0.62, orientation: 180 },
        block: {
          type: 'SHIELDING',
          trayId: 'T1',
          transmission: 0.03,
          outline: [
            [0, 0],
            [20, 0],
            [20, 20],
            [0, 20],
          ],
        },
      }),
    ]).plan.beams[0]!;
    expect(b.wedges[0]).toMatchObject({ number: 1, id: 'W30', angleDeg: 30, factor: 0.62, orientationDeg: 180, sourceToWedgeTrayDistanceMm: 600 });
    expect(b.blocks[0]).toMatchObject({
      type: 'SHIELDING',
      trayId: 'T1',
      transmission: 0.03,
      outlineMm: [
        [0, 0],
        [20, 0],
        [20, 20],
        [0, 20],
      ],
    });
    const mlc = b.limitingDevices.find((d) => d.type === 'MLCX')!;
    expect(mlc.numberOfPairs).toBe(MLC_PAIRS);
    expect(mlc.leafBoundariesMm).toHaveLength(MLC_PAIRS + 1);
  });
  it('a radiation type the standard does not define is refused, naming the beam', () => {
    const issues = refused((ds) => (beam0(ds).RadiationType = 'XRAY'));
    expect(issues[0]).toMatchObject({ code: 'invalid-value', beamNumber: 1, beamName: 'AP', found: '"XRAY"' });
  });
  it('a declared count that disagrees with its sequence (Number of Control Points 3, two present)', () => {
    const issues = refused((ds) => (beam0(ds).NumberOfControlPoints = '3'));
    expect(issues[0]).toMatchObject({
      code: 'inconsistent',
      path: 'BeamSequence[0].NumberOfControlPoints',
      expected: '2 (items present)',
      found: '3',
    });
  });
  it("a final cumulative meterset weight that differs from the last control point's", () => {
    const issues = refused((ds) => (beam0(ds).FinalCumulativeMetersetWeight = '2'));
    expect(issues[0]).toMatchObject({ code: 'inconsistent', expected: '1', found: '2' });
  });
  it('leaf boundaries that are not one more than the leaf pairs', () => {
    const issues = refused(
      (ds) =>
        (beam0(ds).BeamLimitingDeviceSequence[2].LeafPositionBoundaries = beam0(ds).BeamLimitingDeviceSequence[2].LeafPositionBoundaries.slice(1)),
      [staticBeam(1, 'AP', 6, 0, 900, POINT, { mlc: true })],
    );
    expect(issues[0]!.path).toMatch(/LeafPositionBoundaries$/);
  });
  it('jaws with more than one pair', () => {
    const issues = refused((ds) => (beam0(ds).BeamLimitingDeviceSequence[0].NumberOfLeafJawPairs = '2'));
    expect(issues[0]).toMatchObject({ code: 'invalid-value', expected: '1', found: '2' });
  });
  it('a source-axis distance of zero is outside what a treatment can hold', () => {
    expect(refused((ds) => (beam0(ds).SourceAxisDistance = '0'))[0]).toMatchObject({
      code: 'physical-range',
      path: 'BeamSequence[0].SourceAxisDistance',
    });
  });
  it('two beams with one number', () => {
    const issues = refused(
      (ds) => (ds.BeamSequence[1].BeamNumber = '1'),
      [staticBeam(1, 'AP', 6, 0, 900, POINT), staticBeam(2, 'PA', 6, 180, 900, POINT)],
    );
    expect(issues.some((i) => i.code === 'duplicate' && i.path === 'BeamSequence')).toBe(true);
  });
});
