/**
 * Totals per point: the sum of the checked beams against the planning system's sum and the
 * prescription. Check values are sums and the deviation's definition (common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { courseTotals } from '../../src/check/totals.js';
import type { FractionGroupCheck } from '../../src/model/index.js';

const total = (independentDoseCGy: number, planningSystemDoseCGy: number) => ({
  pointPatientMm: [0, 0, 0] as [number, number, number],
  beams: [1],
  independentDoseCGy,
  planningSystemDoseCGy,
  complete: true,
});
const group = (n: number, fractions: number | undefined, t: ReturnType<typeof total>): FractionGroupCheck => ({
  number: n,
  ...(fractions !== undefined ? { fractionsPlanned: fractions } : {}),
  beams: [],
  totals: [t],
});

describe('course totals', () => {
  it('add each group times its fractions, per point, and compare the sums', () => {
    const [t] = courseTotals([group(1, 25, total(201, 200)), group(2, 5, total(198, 200))]);
    expect(t!.independentDoseCGy).toBeCloseTo(25 * 201 + 5 * 198, 9);
    expect(t!.planningSystemDoseCGy).toBeCloseTo(30 * 200, 9);
    expect(t!.deviationPercent).toBeCloseTo((100 * (25 * 201 + 5 * 198 - 6000)) / 6000, 12);
  });
  it('give no deviation, never Infinity or NaN, when the planning system gives nothing to compare with', () => {
    const [t] = courseTotals([group(1, undefined, total(200, 200))]);
    expect(t!.planningSystemDoseCGy).toBe(0);
    expect(t!.deviationPercent).toBeUndefined();
  });
});
