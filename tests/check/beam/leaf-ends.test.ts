/**
 * The rounded leaf ends, as the dosimetric leaf gap of the beam data: every open leaf pair is widened
 * by it (half at each leaf end), never beyond the jaws; closed pairs stay closed.
 * Check values: a leaf pair widened by g lets through what a pair opened g wider does (the gap's
 * definition, common practice, no source); for a sliding window of width w sweeping at constant
 * speed, the point's primary exposure grows as (w + g)/w, diluted by the leaf transmission it
 * receives the rest of the time, and its scatter grows with the window's area (common practice, no
 * source: the first-order primary-plus-scatter estimate below).
 */
import { describe, expect, it } from 'vitest';
import { type BeamSpec, MLC_BOUNDARIES_MM, MLC_PAIRS, staticBeam } from '../../../scripts/fixtures/plan-parts.js';
import type { MachineModel } from '../../../src/model/index.js';
import { beams, check, oneBeamPlan, type TestBeam } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';

/** The demo machine without its dosimetric leaf gap (leaf ends not modelled). */
const demo: MachineModel = (() => {
  const m = machine(DEMO_MANIFEST);
  return { ...m, beams: m.beams.map(({ dosimetricLeafGapMm: _, ...b }) => b) } as MachineModel;
})();
const withGap = (m: MachineModel, gapMm: number): MachineModel => ({
  ...m,
  beams: m.beams.map((b) => (b.id === '6X' ? { ...b, dosimetricLeafGapMm: gapMm } : b)),
});
const iso: [number, number, number] = [0, 0, 0];

/** Leaf positions: pairs whose band lies within ±50 mm open from `a` to `b`, the others closed at 0. */
function leaves(a: number, b: number): number[] {
  const inside = (i: number) => MLC_BOUNDARIES_MM[i]! >= -50 && MLC_BOUNDARIES_MM[i + 1]! <= 50;
  const bankA = Array.from({ length: MLC_PAIRS }, (_, i) => (inside(i) ? a : 0));
  const bankB = Array.from({ length: MLC_PAIRS }, (_, i) => (inside(i) ? b : 0));
  return [...bankA, ...bankB];
}

/** A sliding window of width `widthMm` sweeping from x = −60 to +60 mm at constant speed (MU evenly spread). */
function slidingWindow(widthMm: number, n = 241): BeamSpec {
  const base = staticBeam(1, 'SW', 6, 0, 900, iso, { mlc: true, first: { jawsXMm: [-70, 70], jawsYMm: [-50, 50] } });
  const first = base.controlPoints[0]!;
  const travel = 120 - widthMm;
  const controlPoints = Array.from({ length: n }, (_, j) => {
    const a = -60 + (j * travel) / (n - 1);
    return {
      ...(j === 0 ? first : { gantryDeg: 0, jawsXMm: first.jawsXMm, jawsYMm: first.jawsYMm }),
      leaves: leaves(a, a + widthMm),
      weight: j / (n - 1),
      doseCoefficient: j / (n - 1),
    };
  });
  return { ...base, dynamic: true, controlPoints };
}

function run(name: string, b: BeamSpec, m: MachineModel): TestBeam {
  return beams(check(oneBeamPlan(name, b, iso, { patientId: 'DLG-1' }), m))[0]!;
}
const dpm = (b: TestBeam): number => {
  if (b.status !== 'checked') throw new Error(JSON.stringify(b.reason));
  return b.calculation.dosePerMuCGy;
};

describe('the dosimetric leaf gap', () => {
  for (const widthMm of [10, 20, 40]) {
    it(`a ${widthMm} mm sliding window with a 1.5 mm gap gets the dose of a ${widthMm + 1.5} mm window without one`, () => {
      const widened = dpm(run(`sw-${widthMm}-g`, slidingWindow(widthMm), withGap(demo, 1.5)));
      // The same leaf speeds: the wider window's control points are the narrower one's, each leaf end 0.75 mm further out.
      const wider = slidingWindow(widthMm);
      const shifted = {
        ...wider,
        controlPoints: wider.controlPoints.map((c) => ({
          ...c,
          leaves: c.leaves!.map((x, i) =>
            x === 0 && c.leaves![i + (i < MLC_PAIRS ? MLC_PAIRS : -MLC_PAIRS)] === 0 ? 0 : i < MLC_PAIRS ? x - 0.75 : x + 0.75,
          ),
        })),
      };
      expect(widened / dpm(run(`sw-${widthMm}-w`, shifted, demo)) - 1).toBeCloseTo(0, 9);
    });
  }
  it('the change it makes falls as the window widens, as the first-order primary-plus-scatter estimate says', () => {
    const t = demo.beams.find((b) => b.id === '6X')!.mlcTransmission ?? 0;
    for (const widthMm of [10, 20, 40]) {
      const change =
        dpm(run(`sw-${widthMm}-a`, slidingWindow(widthMm), withGap(demo, 1.5))) / dpm(run(`sw-${widthMm}-b`, slidingWindow(widthMm), demo)) - 1;
      // Open share of the sweep f = w/(120 − w); dose ∝ f·(1 − T) + T; widened, f grows by 1.5/w.
      const f = widthMm / (120 - widthMm);
      const estimate = ((1.5 / widthMm) * f * (1 - t)) / (f * (1 - t) + t);
      expect(change).toBeGreaterThan(0.8 * estimate);
      expect(change).toBeLessThan(1.2 * estimate);
    }
  });
  it("a static field's dose does not change when its leaves sit under the jaws", () => {
    const field = staticBeam(1, 'AP', 6, 0, 900, iso, { mlc: true, first: { jawsXMm: [-50, 50], jawsYMm: [-50, 50], leaves: leaves(-55, 55) } });
    const without = run('static-under-jaws-0', field, demo);
    const withIt = run('static-under-jaws-g', field, withGap(demo, 2));
    expect(dpm(withIt)).toBe(dpm(without));
  });
  it('names the gap it used, or says the leaf ends are not modelled', () => {
    const b = run('sw-note', slidingWindow(20), withGap(demo, 1.5));
    expect(b.status === 'checked' && b.calculation.approximations).toContainEqual({ code: 'leaf-end-gap', values: { gapMm: 1.5 } });
    const c = run('sw-note-0', slidingWindow(20), demo);
    expect(c.status === 'checked' && c.calculation.approximations.map((a) => a.code)).toContain('leaf-ends-not-modelled');
  });
});
