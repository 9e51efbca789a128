/**
 * Control limits of the deviation trend: centre line the mean, limits mean ± 3σ with σ the sample
 * standard deviation (the Shewhart individuals-chart practice used for QA results; common practice,
 * no source). Values worked by hand.
 */
import { describe, expect, it } from 'vitest';
import { controlLimits } from '../../../src/service/web/control-limits.js';

describe('control limits', () => {
  it('1, 2, 3, 4, 5 %: mean 3, σ = √2.5 = 1.5811, limits −1.743 and 7.743 %', () => {
    const l = controlLimits([1, 2, 3, 4, 5])!;
    expect(l.mean).toBe(3);
    expect(l.sigma).toBeCloseTo(1.58114, 5);
    expect(l.lower).toBeCloseTo(-1.74342, 5);
    expect(l.upper).toBeCloseTo(7.74342, 5);
  });
  it('no limits from fewer than two values', () => {
    expect(controlLimits([])).toBeUndefined();
    expect(controlLimits([2])).toBeUndefined();
  });
});
