/**
 * The segments of a modulated beam: each stretch between two control points that delivers
 * meterset, with its share of the MU, at the control point halfway (gantry the short way round,
 * leaves averaged). Check values are arithmetic on the control points (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { segmentsOf } from '../../../src/check/beam/segments.js';
import type { ControlPoint } from '../../../src/model/index.js';

const cp = (index: number, gantryAngleDeg: number, cumulativeMetersetWeight: number, leafMm: number, ssdMm?: number): ControlPoint => ({
  index,
  gantryAngleDeg,
  collimatorAngleDeg: 0,
  couchAngleDeg: 0,
  cumulativeMetersetWeight,
  ...(ssdMm !== undefined ? { ssdMm } : {}),
  devices: [{ type: 'MLCX', positionsMm: [-leafMm, leafMm] }],
  wedgePositions: [],
  doseReferenceCoefficients: [],
});

describe('segments of a modulated beam', () => {
  it('share the MU by meterset weight, skip stretches that deliver none, and sum to one', () => {
    const s = segmentsOf([cp(0, 0, 0, 10), cp(1, 0, 0.25, 20), cp(2, 0, 0.25, 30), cp(3, 0, 1, 40)], undefined);
    expect(s.map((x) => [x.from, x.share])).toEqual([
      [0, 0.25],
      [2, 0.75],
    ]);
    expect(s.reduce((a, x) => a + x.share, 0)).toBeCloseTo(1, 15);
    expect(s[0]!.mid.devices[0]!.positionsMm).toEqual([-15, 15]);
  });
  it('turn the gantry the short way round through 0°, and average the SSDs of a moving gantry', () => {
    const [s] = segmentsOf([cp(0, 350, 0, 10, 900), cp(1, 10, 1, 10, 910)], 1);
    expect(s!.mid.gantryAngleDeg).toBeCloseTo(0, 12);
    expect(s!.ssdMm).toBe(905);
  });
  it('keep the first SSD for all while the gantry stands still', () => {
    const s = segmentsOf([cp(0, 90, 0, 10, 900), cp(1, 90, 0.5, 20), cp(2, 90, 1, 30)], 1);
    expect(s.map((x) => x.ssdMm)).toEqual([900, 900]);
  });
});
