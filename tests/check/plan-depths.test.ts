/**
 * Depths of every beam of a plan through its CT: the SSD along the central axis beside the plan's,
 * the geometric and radiological depth of the point (a slab of density ρ and thickness t shortens
 * the radiological depth by (1 − ρ)·t: the definition of the effective path length), and the reason
 * when a beam cannot be traced.
 */
import { describe, expect, it } from 'vitest';
import { staticBeam } from '../../scripts/fixtures/plan-parts.js';
import { planDepths } from '../../src/check/plan-depths.js';
import type { Plan } from '../../src/model/index.js';
import { oneBeamPlan } from '../helpers/check-run.js';
import { boxCt } from '../helpers/model-ct.js';

const iso: [number, number, number] = [0, 0, 0];
/** HFS, gantry 0: the source is anterior (−y). The box's voxels are centred out to ±100 mm, so its faces lie at ±102.5 mm (each voxel its 5 mm cube). */
const ap = oneBeamPlan('depths-ap', staticBeam(1, 'AP', 6, 0, 905, iso), iso);
const water = boxCt({ halfMm: 100 });
const lung = boxCt({ halfMm: 100, slabs: [{ fromMm: -60, toMm: -25, hu: -750 }] });

describe('planDepths', () => {
  it("an AP beam to the centre of a water box: 102.5 mm deep both ways; the CT's SSD 897.5 mm beside the plan's 905", () => {
    const [row] = planDepths(ap, water);
    expect(row!.problem).toBeUndefined();
    expect(row!.geometricDepthMm).toBeCloseTo(102.5, 6);
    expect(row!.radiologicalDepthMm).toBeCloseTo(102.5, 6);
    expect(row!.ctSsdAlongAxisMm).toBeCloseTo(897.5, 6);
    expect(row!.ssdDifferenceMm).toBeCloseTo(-7.5, 6);
    expect(row!.planSsdMm).toBe(905);
  });
  it('a 40 mm slab of density 0.25 on the way: the radiological depth 0.75 × 40 = 30 mm shorter', () => {
    const [w] = planDepths(ap, water);
    const [l] = planDepths(ap, lung);
    expect(w!.geometricDepthMm! - l!.radiologicalDepthMm!).toBeCloseTo(30, 6);
    expect(l!.densityRange![0]).toBeCloseTo(0.25, 6);
  });
  it('a lateral beam crosses the slab edgewise and the point is in water: no change', () => {
    const lat = oneBeamPlan('depths-lat', staticBeam(1, 'LAT', 6, 90, 900, iso), iso);
    const [row] = planDepths(lat, lung);
    expect(row!.radiologicalDepthMm).toBeCloseTo(row!.geometricDepthMm!, 6);
  });
  it('a position the frames do not support is a problem row, not a depth', () => {
    const decubitus: Plan = { ...ap, patientSetups: ap.patientSetups.map((s) => ({ ...s, position: 'HFDL' })) };
    const [row] = planDepths(decubitus, water);
    expect(row!.problem).toMatchObject({ code: 'patient-position', values: { position: 'HFDL' } });
    expect(row!.geometricDepthMm).toBeUndefined();
  });
  it('an arc gives one row per control point', () => {
    const arc = staticBeam(1, 'ARC', 6, 180, 900, iso, { dynamic: true, first: { gantryDirection: 'CW' } });
    const plan = oneBeamPlan(
      'depths-arc',
      { ...arc, controlPoints: [arc.controlPoints[0]!, { weight: 0.5, gantryDeg: 270 }, { weight: 1, gantryDeg: 0 }] },
      iso,
    );
    const rows = planDepths(plan, water);
    expect(rows.map((r) => [r.controlPointIndex, r.gantryAngleDeg])).toEqual([
      [0, 180],
      [1, 270],
      [2, 0],
    ]);
    for (const r of rows) expect(r.geometricDepthMm).toBeCloseTo(102.5, 6);
  });
});
