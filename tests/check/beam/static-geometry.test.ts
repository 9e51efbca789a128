/**
 * Where a static photon beam meets the patient, or why it cannot be checked: its SAD against the
 * machine's, an SSD or a CT to find the depth, a point below the surface, an open aperture, a point
 * not under a block; and the setup the SSD implies (SSD setup when the SSD is the SAD within the
 * policy's margin, else isocentric; common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { staticBeam } from '../../../scripts/fixtures/plan-parts.js';
import type { Plan } from '../../../src/model/index.js';
import { beams, check, oneBeamPlan, type TestBeam } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const iso: [number, number, number] = [0, 0, 0];
const first = (p: Plan): TestBeam => beams(check(p, demo))[0]!;
const reason = (b: TestBeam) => (b.status === 'not checked' ? b.reason : undefined);

describe('static geometry', () => {
  it('SSD 100 cm is an SSD setup; SSD 90 cm puts the isocenter 10 cm deep', () => {
    expect(first(oneBeamPlan('sg-ssd', staticBeam(1, 'AP', 6, 0, 1000, [0, 100, 0]), [0, 200, 0])).calculation.setupBasis).toEqual({
      code: 'ssd-equals-sad',
      values: { ssdCm: 100 },
    });
    const sad = first(oneBeamPlan('sg-sad', staticBeam(1, 'AP', 6, 0, 900, iso), iso));
    expect(sad.calculation.setup).toBe('SAD');
    expect(sad.calculation.setupBasis).toEqual({ code: 'isocenter-deep', values: { depthCm: 10 } });
    expect(sad.calculation.depthCm).toBeCloseTo(10, 12);
  });
  it("a beam whose SAD is not the machine's is not checked", () => {
    const p = oneBeamPlan('sg-sad80', staticBeam(1, 'AP', 6, 0, 700, iso), iso);
    const b = first({ ...p, beams: p.beams.map((x) => ({ ...x, sourceAxisDistanceMm: 800 })) });
    expect(reason(b)).toEqual({ code: 'sad-differs', values: { sadMm: 800, machineSadCm: 100 } });
  });
  it('no SSD and no CT: no depth, not checked', () => {
    const p = oneBeamPlan('sg-nossd', staticBeam(1, 'AP', 6, 0, 900, iso), iso);
    const b = first({ ...p, beams: p.beams.map((x) => ({ ...x, controlPoints: x.controlPoints.map(({ ssdMm: _, ...cp }) => cp) })) });
    expect(reason(b)?.code).toBe('no-ssd-no-ct');
  });
  it('a point 2 cm above the surface is not checked, its height said', () => {
    const b = first(oneBeamPlan('sg-above', staticBeam(1, 'AP', 6, 0, 900, iso), [0, -120, 0]));
    expect(reason(b)).toMatchObject({ code: 'point-above-surface' });
    expect(reason(b)!.values.heightCm).toBeCloseTo(2, 9);
  });
  it('a point under a shielding block is not checked', () => {
    const blocked = staticBeam(1, 'AP', 6, 0, 900, iso, {
      block: {
        type: 'SHIELDING',
        trayId: 'BLOCK_TRAY',
        transmission: 0,
        outline: [
          [-20, -20],
          [20, -20],
          [20, 20],
          [-20, 20],
        ],
      },
    });
    expect(reason(first(oneBeamPlan('sg-blocked', blocked, iso)))?.code).toBe('point-blocked');
  });
});
