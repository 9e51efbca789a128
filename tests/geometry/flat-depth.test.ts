/**
 * Depth below a flat water surface normal to the central axis (no CT): d = source-to-point distance
 * along the axis − SSD, with the point's off-axis distance and its projection to the isocenter plane
 * by similar triangles (geometry, common practice, no source). DICOM patient axes: +x left,
 * +y posterior, +z head; at gantry 0 HFS the source is anterior (PS3.3 C.7.6.2.1.1).
 */
import { describe, expect, it } from 'vitest';
import { beamFrame } from '../../src/geometry/beam-frame.js';
import { flatDepth } from '../../src/geometry/flat-depth.js';
import { anglesControlPoint } from '../helpers/model-beam.js';

const cp = anglesControlPoint;
const frame = (gantry: number) => beamFrame(cp(gantry), 'HFS', 1000)!;

describe('flat depth', () => {
  it('the isocenter at SSD 900 lies 100 mm deep, on the axis, unmagnified', () => {
    const d = flatDepth(frame(0), [0, 0, 0], 900);
    expect(d).toMatchObject({ sourceToPointAxialMm: 1000, offAxisMm: 0, rayCosine: 1 });
    expect(d.depthMm).toBeCloseTo(100, 12);
  });
  it('a point 100 mm nearer the source (anterior) is at the surface, its off-axis distance magnified to the isocenter plane by 1000/900', () => {
    const d = flatDepth(frame(0), [30, -100, 40], 900);
    expect(d.depthMm).toBeCloseTo(0, 12);
    expect(d.offAxisMm).toBeCloseTo(50, 12);
    expect(Math.hypot(...d.atIsocenterPlaneMm)).toBeCloseTo((50 * 1000) / 900, 10);
    expect(d.rayCosine).toBeCloseTo(900 / Math.hypot(900, 50), 12);
  });
  it('depth is measured along the central axis, not along the ray: an off-axis point at the isocenter plane is as deep as the isocenter', () => {
    expect(flatDepth(frame(0), [80, 0, -60], 920).depthMm).toBeCloseTo(80, 12);
  });
  it("gantry 90 (source at the patient's left): a point 50 mm to the right is 50 mm deeper", () => {
    expect(flatDepth(frame(90), [-50, 0, 0], 900).depthMm).toBeCloseTo(150, 10);
    expect(flatDepth(frame(90), [-50, 0, 0], 900).offAxisMm).toBeCloseTo(0, 10);
  });
  it('the point in the beam limiting device frame lies at the same distance from the isocenter', () => {
    const d = flatDepth(frame(37), [12, -34, 56], 950);
    expect(Math.hypot(...d.pointBldMm)).toBeCloseTo(Math.hypot(12, -34, 56), 10);
  });
});
