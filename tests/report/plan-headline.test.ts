import { describe, expect, it } from 'vitest';
import { needsAttention, planHeadline } from '../../src/report/plan-headline.js';

const issue = { severity: 'error' as const, code: 'missing-table' as const, message: 'x' };

describe("a plan's headline", () => {
  it('says refused for an input error, else the verdict, with "not fully verified" where the verdict does not say it', () => {
    expect(planHeadline({ issues: [issue], verdict: 'within tolerance', fullyVerified: true })).toBe('refused (input error)');
    expect(planHeadline({ issues: [], verdict: 'within tolerance', fullyVerified: true })).toBe('within tolerance');
    expect(planHeadline({ issues: [], verdict: 'beyond action level', fullyVerified: false })).toBe('beyond action level, not fully verified');
    expect(planHeadline({ issues: [], verdict: 'not verified', fullyVerified: false })).toBe('not verified');
  });
  it('wants attention for anything but a clean within tolerance', () => {
    expect(needsAttention({ issues: [], verdict: 'within tolerance', fullyVerified: true })).toBe(false);
    expect(needsAttention({ issues: [], verdict: 'within tolerance', fullyVerified: false })).toBe(true);
    expect(needsAttention({ issues: [issue], verdict: 'within tolerance', fullyVerified: true })).toBe(true);
  });
});
