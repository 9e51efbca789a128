import { describe, expect, it } from 'vitest';
import { percentDeviation, percentOf } from '../../src/check/deviation.js';

describe('the one guarded percent deviation', () => {
  it('is (value − reference) / reference in percent', () => {
    // Definition of the deviation reported by every check (common practice, no source).
    expect(percentDeviation(102, 100)).toBeCloseTo(2, 12);
    expect(percentDeviation(95, 100)).toBeCloseTo(-5, 12);
    expect(percentOf(3, 200)).toBeCloseTo(1.5, 12);
  });
  it('gives nothing, never Infinity or NaN, when the reference is zero, negative or not finite', () => {
    for (const ref of [0, -100, NaN, Infinity, -Infinity]) expect(percentDeviation(100, ref)).toBeUndefined();
    expect(percentDeviation(Infinity, 100)).toBeUndefined();
    expect(percentDeviation(NaN, 100)).toBeUndefined();
    expect(percentOf(1e308, 1e-10)).toBeUndefined();
  });
});
