/**
 * What a static photon beam hands the physics at its point, and what the result must say it
 * approximated: Clarkson sectors for a field the leaves shape (in the TPR form even for an SSD
 * setup), the leaf ends, a bolus, an asymmetric swept wedge. Demo machine (invented values).
 */
import { describe, expect, it } from 'vitest';
import { type BeamSpec, MLC_PAIRS, staticBeam } from '../../../scripts/fixtures/plan-parts.js';
import type { MachineModel } from '../../../src/model/index.js';
import { beams, check, oneBeamPlan, type TestBeam } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const iso: [number, number, number] = [0, 0, 0];
const run = (name: string, b: BeamSpec, m: MachineModel = demo, point = iso): TestBeam => beams(check(oneBeamPlan(name, b, point), m))[0]!;
const codes = (b: TestBeam) => b.calculation!.approximations.map((a) => a.code);
/** Leaves open ±30 mm in x on every pair (bank A at −30, bank B at +30): a 6 cm wide field inside 10 cm jaws. */
const narrowLeaves = [...Array(MLC_PAIRS).fill(-30), ...Array(MLC_PAIRS).fill(30)];

describe('the static field', () => {
  it('an open rectangle: no sectors, no approximation', () => {
    expect(codes(run('sf-open', staticBeam(1, 'AP', 6, 0, 900, iso)))).toEqual([]);
  });
  it('leaves shaping the field: Clarkson sectors (72), the leaf ends as the beam data take them', () => {
    const b = run('sf-mlc', staticBeam(1, 'AP', 6, 0, 900, iso, { mlc: true, first: { leaves: narrowLeaves } }));
    const c = b.calculation!.approximations.find((a) => a.code === 'clarkson-irregular')!;
    expect(c.values).toMatchObject({ mlc: 1, blocks: 0, sectors: 72 });
    const gapMm = demo.beams.find((x) => x.id === '6X')!.dosimetricLeafGapMm;
    expect(gapMm).toBeGreaterThan(0); // the demo machine states one (invented)
    expect(b.calculation!.approximations).toContainEqual({ code: 'leaf-end-gap', values: { gapMm } });
    expect(b.calculation!.irradiatedSquareCm).toBeLessThan(b.calculation!.collimatorSquareCm);
  });
  it('an irregular field in an SSD setup says it takes the TPR form', () => {
    const b = run('sf-mlc-ssd', staticBeam(1, 'AP', 6, 0, 1000, [0, 100, 0], { mlc: true, first: { leaves: narrowLeaves } }), demo, [0, 200, 0]);
    expect(codes(b)).toContain('ssd-irregular-tpr-form');
  });
  it('without a dosimetric leaf gap in the beam data, the leaf ends are said not to be modelled', () => {
    const noGap = { ...demo, beams: demo.beams.map(({ dosimetricLeafGapMm: _, ...b }) => b) };
    expect(codes(run('sf-nogap', staticBeam(1, 'AP', 6, 0, 900, iso, { mlc: true, first: { leaves: narrowLeaves } }), noGap))).toContain(
      'leaf-ends-not-modelled',
    );
  });
  it('leaves all outside the jaws shape nothing: no leaf-end note', () => {
    const wide = [...Array(MLC_PAIRS).fill(-80), ...Array(MLC_PAIRS).fill(80)];
    const b = run('sf-wide', staticBeam(1, 'AP', 6, 0, 900, iso, { mlc: true, first: { leaves: wide } }));
    expect(codes(b).filter((c) => c.startsWith('leaf-'))).toEqual([]);
  });
  it('a bolus: the depth is taken as the plan gives it, and said', () => {
    expect(codes(run('sf-bolus', staticBeam(1, 'AP', 6, 0, 900, iso, { bolusRoi: 7 })))).toContain('bolus-depth');
  });
  it('a swept wedge with asymmetric jaws along the sweep is said to be approximated', () => {
    const sw = staticBeam(1, 'AP SW60', 6, 0, 900, iso, {
      wedge: { id: 'SW60', angle: 60, factor: 0.44, orientation: 0, type: 'DYNAMIC' },
      first: { wedgeIn: true, jawsXMm: [-75, 75], jawsYMm: [-50, 100] },
    });
    expect(codes(run('sf-sw-asym', sw))).toContain('swept-wedge-asymmetric');
  });
});
