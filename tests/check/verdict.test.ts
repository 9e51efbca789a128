import { describe, expect, it } from 'vitest';
import { verdictFor, worst } from '../../src/check/verdict.js';

describe('verdicts', () => {
  it('within the tolerance (inclusive), beyond the action level (exclusive), else needs review, whatever the sign', () => {
    expect(verdictFor(2, 2, 3)).toBe('within tolerance');
    expect(verdictFor(-2.01, 2, 3)).toBe('needs review');
    expect(verdictFor(3, 2, 3)).toBe('needs review');
    expect(verdictFor(-3.01, 2, 3)).toBe('beyond action level');
  });
  it('the worse of two, in the order of severity', () => {
    expect(worst('within tolerance', 'needs review')).toBe('needs review');
    expect(worst('beyond action level', 'not verified')).toBe('beyond action level');
    expect(worst('not verified', 'needs review')).toBe('not verified');
  });
});
