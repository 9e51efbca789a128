/**
 * An electron beam's applicator and cutout as the physics takes them: a rectangle by the square-root
 * rule, any other outline by its equal-area square (common practice, no source); a beam without an
 * applicator, with shielding blocks or with a cutout wider than its applicator not checked; an
 * applicator the beam data lack refusing the plan. Demo machine (invented values).
 */
import { describe, expect, it } from 'vitest';
import type { PlanCheck } from '../../../src/model/index.js';
import { beams, type ElectronExtra, electronPlanCheck, type TestBeam } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const plan = (name: string, depthMm: number, extra: ElectronExtra = {}) => electronPlanCheck(name, depthMm, extra, demo);
const beam = (r: PlanCheck): TestBeam => beams(r)[0]!;
const reason = (b: TestBeam) => (b.status === 'not checked' ? b.reason : undefined);

describe('the electron field', () => {
  it('the open applicator: its own side, no cutout', () => {
    const b = beam(plan('ef-open', 20));
    expect(b.calculation!.electron!.cutout).toBe('none');
    expect(b.calculation!.electron!.fieldSideCm).toBeCloseTo(10, 12);
  });
  it('an L-shaped cutout takes the square of its area: 64 cm² of outline at the isocenter plane is 8 cm there (SSD 100 = SAD)', () => {
    // A 10 × 10 cm square less a 6 × 6 cm corner: 100 − 36 = 64 cm².
    const l = beam(
      plan('ef-l', 20, {
        cutout: [
          [-50, -50],
          [50, -50],
          [50, -10],
          [-10, -10],
          [-10, 50],
          [-50, 50],
        ],
      }),
    );
    expect(l.calculation!.electron!.cutout).toBe('shaped');
    expect(l.calculation!.electron!.fieldSideCm).toBeCloseTo(8, 9);
  });
  it('a cutout 14 cm across in a 10 cm applicator is not checked', () => {
    const b = beam(
      plan('ef-wide', 20, {
        cutout: [
          [-70, -30],
          [70, -30],
          [70, 30],
          [-70, 30],
        ],
      }),
    );
    expect(reason(b)).toMatchObject({ code: 'cutout-too-large', values: { spanCm: 14, applicatorId: 'A10', applicatorSideCm: 10 } });
  });
  it('a beam without an applicator, or with a shielding block, is not checked', () => {
    expect(reason(beam(plan('ef-none', 20, { noApplicator: true })))?.code).toBe('electron-no-applicator');
    const shield = {
      type: 'SHIELDING' as const,
      trayId: 'T',
      transmission: 0,
      outline: [
        [0, 0],
        [10, 0],
        [10, 10],
        [0, 10],
      ] as [number, number][],
    };
    expect(reason(beam(plan('ef-block', 20, { block: shield })))?.code).toBe('electron-blocks');
  });
  it("a rectangular cutout uses the square-root rule (its Se is the geometric mean of the squares')", () => {
    const rect = beam(
      plan('e-rect', 20, {
        cutout: [
          [-30, -40],
          [30, -40],
          [30, 40],
          [-30, 40],
        ],
      }),
    );
    const se = (side: number) =>
      demo.electronBeams
        .find((e) => e.id === '9E')!
        .applicators.find((a) => a.id === 'A10')!
        .outputFactor.at(side, 0, []);
    expect(rect.calculation!.factors.find((f) => f.key === 'Se')!.value).toBeCloseTo(Math.sqrt(se(6) * se(8)), 12);
    expect(rect.calculation!.electron!.cutout).toBe('rectangle');
  });
  it('an applicator the beam data lack is an input error naming those it has', () => {
    const r = plan('e-app', 20, { applicator: 'A25' });
    expect(r.issues[0]!.message).toMatch(/no applicator "A25"/);
    expect(r.issues[0]!.expected).toBe('A06, A10, A15, A20');
  });
});
