/**
 * A beam's case category: the most demanding one that applies (the widest action level), from the
 * policy's classification limits. Levels are the default policy's (in the spirit of AAPM TG-114,
 * from memory); the tests read them from the policy, so a clinic's own levels change nothing here.
 */
import { describe, expect, it } from 'vitest';
import { categorize, isHeterogeneous, levelsOf, planningSystemCorrectedBeam } from '../../../src/check/beam/category.js';
import type { BeamCheckContext } from '../../../src/check/beam/context.js';
import { DEFAULT_POLICY, type Policy } from '../../../src/check/policy.js';

const open = { wedged: false, offAxisCm: 0, irradiatedSquareCm: 10, openFraction: 1, ssdCm: 100, shaped: false, heterogeneous: false };

describe('categorize', () => {
  it('an open field on the axis', () => expect(categorize(DEFAULT_POLICY, open)).toBe('on-axis-open'));
  it('each fact alone gives its category', () => {
    expect(categorize(DEFAULT_POLICY, { ...open, wedged: true })).toBe('off-axis-or-wedged');
    expect(categorize(DEFAULT_POLICY, { ...open, offAxisCm: 2.5 })).toBe('off-axis-or-wedged');
    expect(categorize(DEFAULT_POLICY, { ...open, irradiatedSquareCm: 3 })).toBe('irregular-or-small');
    expect(categorize(DEFAULT_POLICY, { ...open, shaped: true, openFraction: 0.6 })).toBe('irregular-or-small');
    expect(categorize(DEFAULT_POLICY, { ...open, ssdCm: 120 })).toBe('large-ssd');
    expect(categorize(DEFAULT_POLICY, { ...open, heterogeneous: true })).toBe('heterogeneous');
  });
  it('the limits themselves belong to the milder category (2 cm off axis, a 4 cm field, SSD 110 cm)', () => {
    expect(categorize(DEFAULT_POLICY, { ...open, offAxisCm: 2, irradiatedSquareCm: 4, ssdCm: 110 })).toBe('on-axis-open');
  });
  it('with several, the one with the widest action level wins, whichever the policy makes widest', () => {
    expect(categorize(DEFAULT_POLICY, { ...open, wedged: true, heterogeneous: true })).toBe('heterogeneous');
    const wedgeWidest: Policy = {
      ...DEFAULT_POLICY,
      levels: { ...DEFAULT_POLICY.levels, 'off-axis-or-wedged': { tolerancePercent: 5, actionPercent: 8 } },
    };
    expect(categorize(wedgeWidest, { ...open, wedged: true, heterogeneous: true })).toBe('off-axis-or-wedged');
  });
  it('levelsOf carries the policy numbers with the category', () => {
    expect(levelsOf(DEFAULT_POLICY, 'large-ssd')).toEqual({ category: 'large-ssd', ...DEFAULT_POLICY.levels['large-ssd'] });
  });
});

describe('heterogeneity', () => {
  it('with the CT: densities outside the water-like range make the case heterogeneous', () => {
    expect(isHeterogeneous(DEFAULT_POLICY, [0.95, 1.05])).toBe(false);
    expect(isHeterogeneous(DEFAULT_POLICY, [0.25, 1.05])).toBe(true);
    expect(isHeterogeneous(DEFAULT_POLICY, [0.95, 1.6])).toBe(true);
  });
  it("without the CT: only the planning system's word that it corrected", () => {
    expect(isHeterogeneous(DEFAULT_POLICY, undefined, true)).toBe(true);
    expect(isHeterogeneous(DEFAULT_POLICY, undefined, false)).toBe(false);
    expect(isHeterogeneous(DEFAULT_POLICY, undefined)).toBe(false);
  });
  it("the planning system corrected a beam when its equivalent depth differs from its depth by more than 1 mm; else the plan's word", () => {
    const ctx = (depthMm?: number, equivalentDepthMm?: number, corrected?: boolean) =>
      ({ planningSystemDepths: { depthMm, equivalentDepthMm }, planningSystemCorrected: corrected }) as unknown as BeamCheckContext;
    expect(planningSystemCorrectedBeam(ctx(100, 131.5, false))).toBe(true);
    expect(planningSystemCorrectedBeam(ctx(100, 100.5, true))).toBe(false);
    expect(planningSystemCorrectedBeam(ctx(undefined, undefined, true))).toBe(true);
  });
});
