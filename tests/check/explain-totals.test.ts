import { describe, expect, it } from 'vitest';
import { totalExplanation } from '../../src/check/explain-totals.js';
import type { CheckedBeam, DeviationCause, Explanation } from '../../src/model/index.js';

/** Only what a total's explanation reads of a beam: its number and its explanation. */
const beam = (beamNumber: number, explanation: Explanation) => ({ beamNumber, explanation }) as unknown as CheckedBeam;
const cause = (code: DeviationCause['code'], percent: number, confidence: DeviationCause['confidence'] = 'measured'): DeviationCause => ({
  code,
  contributionPercent: percent,
  confidence,
  evidence: {},
});
const explained = (deviationPercent: number, causes: DeviationCause[], residualPercent = 0): Explanation => ({
  deviationPercent,
  causes,
  residualPercent,
  unexplained: false,
});

describe("a plan total's explanation from its beams", () => {
  it('two equal beams, one +10 % all from its depth: the total +5 % all from that depth (weights ½, shares add)', () => {
    const e = totalExplanation(5, [
      { beam: beam(1, explained(10, [cause('depth', 10)])), weight: 1 },
      { beam: beam(2, explained(0, [])), weight: 1 },
    ])!;
    expect(e.causes).toHaveLength(1);
    expect(e.causes[0]!.beams).toEqual([1]);
    expect(e.causes[0]!.contributionPercent).toBeCloseTo(5, 10);
    expect(e.residualPercent).toBeCloseTo(0, 10);
  });
  it('the same cause in two beams is one cause of the total, its confidence the weakest of theirs', () => {
    const e = totalExplanation(3, [
      { beam: beam(1, explained(3, [cause('gradient', 3, 'possible')])), weight: 2 },
      { beam: beam(2, explained(3, [cause('gradient', 3, 'measured')])), weight: 1 },
    ])!;
    expect(e.causes.map((c) => [c.code, c.beams, c.confidence])).toEqual([['gradient', [1, 2], 'possible']]);
    expect(e.causes[0]!.contributionPercent).toBeCloseTo(3, 10);
  });
  it("a beam's deviation shares out over its causes as their logs do (+21 % from two +10 % causes: each half)", () => {
    const e = totalExplanation(21, [{ beam: beam(1, explained(21, [cause('depth', 10), cause('mu-as-typed', 10, 'possible')])), weight: 1 }])!;
    for (const c of e.causes) expect(c.contributionPercent).toBeCloseTo(10, 10);
    expect(e.residualPercent).toBeCloseTo(0, 10);
  });
  it('nothing when a beam at the point has no explanation, or no weight', () => {
    expect(totalExplanation(5, [{ beam: { beamNumber: 1 } as CheckedBeam, weight: 1 }])).toBeUndefined();
    expect(totalExplanation(5, [{ beam: beam(1, explained(5, [])), weight: 0 }])).toBeUndefined();
  });
});
