/** Wrapping the terminal report's prose and wording deviations (presentation rules of the project). */
import { describe, expect, it } from 'vitest';
import type { BeamCheck } from '../../src/model/index.js';
import { deviationText, wrap } from '../../src/report/table.js';

describe('wrapping a line', () => {
  it('cuts at spaces within the width and indents the continuation', () => {
    const lines = wrap('the point is 1.2 cm from the field edge (margin 1.5 cm) and more words follow here', 30, '    ');
    expect(lines.every((l) => l.length <= 30)).toBe(true);
    expect(lines.slice(1).every((l) => l.startsWith('    '))).toBe(true);
    expect(lines.map((l) => l.trim()).join(' ')).toBe('the point is 1.2 cm from the field edge (margin 1.5 cm) and more words follow here');
  });
  it('never separates a number from its unit', () => {
    for (let width = 10; width < 40; width++) {
      for (const l of wrap('tolerance 2.5 %, action level 3.5 %, depth 10.0 cm', width, '  ')) expect(l.trimStart()).not.toMatch(/^(%|cm)\b/);
    }
  });
});

describe('a deviation beside its levels', () => {
  // A checked beam with only what the wording reads: its deviation and its levels (tolerance 2 %, action 3 %).
  const beam = (doseDeviationPercent: number) =>
    ({ status: 'checked', calculation: { doseDeviationPercent }, tolerancePercent: 2, actionPercent: 3 }) as unknown as BeamCheck;
  it('shows 2.974 as +2.97 beside an action level of 3, never +3.0 under "needs review"', () => {
    expect(deviationText(beam(2.974))).toBe('+2.97');
    expect(deviationText(beam(-1.96))).toBe('-1.96');
  });
  it('keeps one decimal away from the levels', () => {
    expect(deviationText(beam(1.2))).toBe('+1.2');
    expect(deviationText(beam(-8.04))).toBe('-8.0');
  });
});
