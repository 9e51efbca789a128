import { describe, expect, it } from 'vitest';
import { DEFAULT_POLICY, Policy } from '../../src/check/policy.js';

describe('the action-level policy', () => {
  it('ships levels for every category, each tolerance below its action level, looser for the harder cases', () => {
    const p = Policy.parse(DEFAULT_POLICY);
    for (const l of Object.values(p.levels)) expect(l.tolerancePercent).toBeLessThan(l.actionPercent);
    expect(p.levels['on-axis-open'].actionPercent).toBeLessThan(p.levels.modulated.actionPercent);
  });
  it('refuses a policy that leaves a category out, naming the category', () => {
    const { modulated: _, ...levels } = DEFAULT_POLICY.levels;
    const r = Policy.safeParse({ ...DEFAULT_POLICY, levels });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join('.'))).toEqual(['levels.modulated']);
  });
});
