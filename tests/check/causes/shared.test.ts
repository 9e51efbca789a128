import { describe, expect, it } from 'vitest';
import { residual, sensitivity, shareLeft } from '../../../src/check/causes/shared.js';
import type { DeviationCause } from '../../../src/model/index.js';

const cause = (code: DeviationCause['code'], percent: number): DeviationCause => ({
  code,
  contributionPercent: percent,
  confidence: 'possible',
  evidence: {},
});

describe('sharing what is left among possible causes', () => {
  it('each keeps its sensitivity, with the sign of what is left, while they fit', () => {
    const r = shareLeft([cause('gradient', 1), cause('leaf-transmission', 2)], -5);
    expect(r.map((c) => c.contributionPercent)).toEqual([-1, -2]);
  });
  it('in proportion to the sensitivities when together they would exceed what is left (6 and 3 sharing 4.5: 3 and 1.5)', () => {
    const r = shareLeft([cause('leaf-transmission', 6), cause('leaf-end-offset', 3)], 4.5);
    expect(r[0]!.contributionPercent).toBeCloseTo(3, 12);
    expect(r[1]!.contributionPercent).toBeCloseTo(1.5, 12);
  });
  it('drops shares that fall to noise, and sensitivities that are noise or not finite', () => {
    expect(shareLeft([cause('gradient', 5), cause('field-edge', 0.05)], 5).map((c) => c.code)).toEqual(['gradient']);
    expect(sensitivity(0.05)).toBeUndefined();
    expect(sensitivity(Number.NaN)).toBeUndefined();
    expect(sensitivity(-0.3)).toBe(0.3);
  });
  it('the residual divides the causes out as ratios: +10 % explained by +4.76 % leaves +5 % (1.1 / 1.047619 = 1.05)', () => {
    expect(residual(10, [cause('depth', 100 * (1.1 / 1.05 - 1))])).toBeCloseTo(5, 10);
  });
});
