/**
 * A traced depth projected on the central axis. Check values by hand (common practice, no source):
 * a point 100 mm off axis in the isocenter plane, SAD 1000 mm, lies on a ray of length √(1000² + 100²);
 * every distance along that ray is multiplied by 1000/√(1000² + 100²) = 0.995037.
 */
import { describe, expect, it } from 'vitest';
import { beamFrame, type CtDepth, projectOnAxis } from '../../src/geometry/index.js';
import type { ControlPoint } from '../../src/model/index.js';

const cp = { index: 0, gantryAngleDeg: 0, collimatorAngleDeg: 0, couchAngleDeg: 0, isocenterPatientMm: [0, 0, 0] } as unknown as ControlPoint;
const frame = beamFrame(cp, 'HFS', 1000)!;

describe('projectOnAxis', () => {
  it('scales every distance along the ray by the cosine of its angle to the central axis, keeping the ray values', () => {
    const ray = Math.hypot(1000, 100);
    const traced: CtDepth = {
      entryPatientMm: [90, -100, 0],
      ssdMm: 0.9 * ray,
      sourceToPointMm: ray,
      geometricDepthMm: 0.1 * ray,
      radiologicalDepthMm: 0.05 * ray,
      densityRange: [0.5, 1],
      nearestInterfaceMm: 20,
      layers: [
        { distanceToPointMm: 0.1 * ray, density: 1 },
        { distanceToPointMm: 20, density: 0.5 },
      ],
    };
    const p = projectOnAxis(traced, frame, [100, 0, 0]);
    const cos = 1000 / ray;
    expect(cos).toBeCloseTo(0.995037, 6);
    expect(p.sourceToPointMm).toBeCloseTo(1000, 9);
    expect(p.ssdMm).toBeCloseTo(900, 9);
    expect(p.geometricDepthMm).toBeCloseTo(100, 9);
    expect(p.radiologicalDepthMm).toBeCloseTo(50, 9);
    expect(p.nearestInterfaceMm).toBeCloseTo(20 * cos, 9);
    expect(p.layers.map((l) => l.distanceToPointMm)).toEqual([100, 20 * cos].map((v) => expect.closeTo(v, 9)));
    expect(p.alongRay).toEqual({ cosine: cos, ssdMm: 0.9 * ray, geometricDepthMm: 0.1 * ray, radiologicalDepthMm: 0.05 * ray });
  });
  it('leaves a point on the central axis unchanged', () => {
    const t: CtDepth = {
      entryPatientMm: [0, -100, 0],
      ssdMm: 900,
      sourceToPointMm: 1000,
      geometricDepthMm: 100,
      radiologicalDepthMm: 100,
      densityRange: [1, 1],
      layers: [],
    };
    const p = projectOnAxis(t, frame, [0, 0, 0]);
    expect([p.ssdMm, p.geometricDepthMm, p.alongRay!.cosine]).toEqual([900, 100, 1]);
  });
});
