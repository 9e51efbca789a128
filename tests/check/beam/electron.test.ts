/**
 * Electron beams in the check, on the invented demo machine: which point is fit for a check (build-up,
 * the steep fall-off), the cutout's shape, the applicator the beam data must know. Depths follow from
 * the geometry (an AP field, head-first supine: gantry 0 enters from −y, the skin at the isocenter).
 */
import { describe, expect, it } from 'vitest';
import type { PlanCheck } from '../../../src/model/index.js';
import { beams, type ElectronExtra, electronPlanCheck, type TestBeam } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const plan = (name: string, depthMm: number, extra: ElectronExtra = {}) => electronPlanCheck(name, depthMm, extra, demo);
const beam = (r: PlanCheck): TestBeam => beams(r)[0]!;

describe('electron beams in the check', () => {
  it("sets the planning system's depth and SSD beside ours, with the differences (values invented for the test)", () => {
    // Ours: SSD 1000 mm from the plan, the point 20 mm below the surface.
    const t = beam(plan('e-depths', 20, { depthData: { depthMm: 21.5, equivalentDepthMm: 21.5, ssdMm: 999 } })).calculation!.planningSystemDepths!;
    expect([t.depthMm, t.ssdMm]).toEqual([21.5, 999]);
    expect(t.depthDifferenceMm).toBeCloseTo(-1.5, 9);
    expect(t.ssdDifferenceMm).toBeCloseTo(1, 9);
    expect(t.equivalentDepthDifferenceMm).toBeUndefined(); // no CT: no radiological depth of ours
  });
  it("at the open applicator's dmax (2.0 cm for 9 MeV, A10): PDD 100 %, Se 1, no flag", () => {
    const b = beam(plan('e-dmax', 20));
    expect(b.calculation!.depthCm).toBeCloseTo(2, 9);
    expect(b.calculation!.electron!.pddPercent).toBeCloseTo(100, 6);
    expect(b.calculation!.factors.find((f) => f.key === 'Se')!.value).toBeCloseTo(1, 4);
    expect(b.fitness!.flags).toEqual([]);
  });
  it('flags a point in the build-up region and one on the steep fall-off', () => {
    expect(beam(plan('e-shallow', 5)).fitness!.flags.map((f) => f.code)).toEqual(['electron-build-up']);
    expect(beam(plan('e-deep', 40)).fitness!.flags.map((f) => f.code)).toEqual(['steep-fall-off']);
  });
});
