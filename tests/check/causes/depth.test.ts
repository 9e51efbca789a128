/**
 * Causes from depths, each the dose ratio the other quantity would make, on a beam whose TPR is
 * e^(−μ(d − 1.5)) whatever the field (built from numbers), so every expectation is e^(±μΔd), with the
 * inverse square ((f + d)/(f + d'))² added for an SSD setup (the surface fixed, the point moving).
 */
import { describe, expect, it } from 'vitest';
import { depthCause, depthDose, heterogeneityCause, ssdCause, statedHeterogeneityCause } from '../../../src/check/causes/depth.js';
import type { CheckedBeam } from '../../../src/model/index.js';
import { photonBeam } from '../../helpers/model-beam.js';

const muPerCm = 0.05;
const data = photonBeam({ tpr: (d) => Math.exp(-muPerCm * (d - 1.5)) });
interface Calc {
  setup?: 'SSD' | 'SAD';
  ssdCm?: number;
  depthCm?: number;
  planningSystemDepths?: { depthMm?: number; depthDifferenceMm?: number; equivalentDepthMm?: number };
  ct?: { correctionFactor: number; ssdDifferenceMm?: number; ssdAlongAxisMm?: number; planSsdMm?: number };
}
const beam = (c: Calc) => ({ calculation: { irradiatedSquareCm: 10, setup: 'SAD', ssdCm: 90, depthCm: 10, ...c } }) as unknown as CheckedBeam;
const f = (c: Calc) => depthDose(beam(c), data, 100);

describe('depth causes', () => {
  it('our depth 5 cm beyond the planning system’s: e^(−5μ) − 1 = −22.1 % (isocentric; depths at the table’s nodes)', () => {
    const c: Calc = { planningSystemDepths: { depthMm: 100, depthDifferenceMm: 50 } };
    const cause = depthCause(beam(c), f(c))!;
    expect(cause.contributionPercent).toBeCloseTo(100 * (Math.exp(-5 * muPerCm) - 1), 8);
    expect(cause.evidence).toMatchObject({ oursCm: 15, planningSystemCm: 10 });
  });
  it('in an SSD setup the inverse square joins: e^(−5μ)·(100 + 10)²/(100 + 15)²', () => {
    const c: Calc = { setup: 'SSD', ssdCm: 100, planningSystemDepths: { depthMm: 100, depthDifferenceMm: 50 } };
    expect(depthCause(beam(c), f(c))!.contributionPercent).toBeCloseTo(100 * (Math.exp(-5 * muPerCm) * (110 / 115) ** 2 - 1), 8);
  });
  it('the planning system corrected to an equivalent depth 3 cm shorter and we did not (no CT): e^(−3μ) − 1 of ours against theirs', () => {
    const c: Calc = { planningSystemDepths: { depthMm: 100, equivalentDepthMm: 70 } };
    const cause = heterogeneityCause(beam(c), f(c))!;
    expect(cause.contributionPercent).toBeCloseTo(100 * (Math.exp(-3 * muPerCm) - 1), 8);
    expect(cause.evidence).toMatchObject({ ours: 'none (no CT)', ourCorrection: 1 });
  });
  it('with the CT and no stated depth: the CT’s SSD 5 cm longer than the plan’s would put the point 5 cm deeper by the plan', () => {
    const c: Calc = { ct: { correctionFactor: 1, ssdDifferenceMm: 50, ssdAlongAxisMm: 950, planSsdMm: 900 } };
    const cause = ssdCause(beam(c), f(c))!;
    expect(cause.contributionPercent).toBeCloseTo(100 * (Math.exp(5 * muPerCm) - 1), 8);
    expect(cause.evidence).toMatchObject({ ctSsdCm: 95, planSsdCm: 90, depthByPlanSsdCm: 15 });
    expect(ssdCause(beam({ ...c, planningSystemDepths: { depthMm: 100 } }), f(c))).toBeUndefined();
  });
  it("the RT Dose's word on heterogeneity: ours measured where it did not correct; named, unmeasured, where it did and we could not", () => {
    expect(statedHeterogeneityCause(beam({ ct: { correctionFactor: 1.04 } }), false)).toMatchObject({ confidence: 'measured' });
    expect(statedHeterogeneityCause(beam({ ct: { correctionFactor: 1.04 } }), false)!.contributionPercent).toBeCloseTo(4, 10);
    expect(statedHeterogeneityCause(beam({}), true)).toMatchObject({ confidence: 'possible', contributionPercent: 0, estimated: false });
    expect(statedHeterogeneityCause(beam({}), undefined)).toBeUndefined();
    expect(statedHeterogeneityCause(beam({ planningSystemDepths: { equivalentDepthMm: 70 } }), true)).toBeUndefined();
  });
});
