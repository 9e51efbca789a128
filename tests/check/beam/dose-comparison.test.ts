/**
 * Our dose for the planned MU and the MU for the planning system's dose, each with its deviation
 * 100·(independent − planning system)/planning system (the convention the report states; the
 * arithmetic by hand).
 */
import { describe, expect, it } from 'vitest';
import { clampRows, compareDose, factorRows } from '../../../src/check/beam/dose-comparison.js';
import type { LookupNote } from '../../../src/model/index.js';

describe('compareDose', () => {
  it('200 MU at 1.01 cGy/MU against 200 cGy planned: 202 cGy (+1 %), 198.02 MU (−0.99 %)', () => {
    const c = compareDose(200, 1.01, 200);
    expect(c.independentDoseCGy).toBeCloseTo(202, 12);
    expect(c.doseDeviationPercent).toBeCloseTo(1, 12);
    expect(c.independentMu).toBeCloseTo(200 / 1.01, 12);
    expect(c.muDeviationPercent).toBeCloseTo(100 * (200 / 1.01 / 200 - 1), 12);
  });
  it('without a planning-system dose, our dose alone', () => {
    expect(compareDose(200, 1.01, undefined)).toEqual({ independentDoseCGy: 202 });
  });
  it('a zero dose per MU gives no MU and no deviation (never a division by zero)', () => {
    expect(compareDose(200, 0, 200)).toEqual({ independentDoseCGy: 0 });
  });
  it('a planning-system dose of 0 gives no deviation', () => {
    expect(compareDose(200, 1, 0).doseDeviationPercent).toBeUndefined();
  });
});

describe('rows of the result', () => {
  it('clamped lookups told once each; refusals are not clamps', () => {
    const n = (requested: number, kind: LookupNote['kind'] = 'clamped'): LookupNote => ({
      table: '6X tpr',
      axis: 'depth',
      requested,
      used: 30,
      kind,
      range: [0, 30],
      unit: 'cm',
    });
    expect(clampRows([n(31.001), n(31.004), n(32), n(40, 'out-of-range')])).toEqual([
      { table: '6X tpr', axis: 'depth', requested: 31.001, used: 30, unit: 'cm' },
      { table: '6X tpr', axis: 'depth', requested: 32, used: 30, unit: 'cm' },
    ]);
  });
  it('factors carry their label and their own copy of the arguments', () => {
    const args = [10, 12];
    const [row] = factorRows([{ key: 'Sc', value: 1.01, args }]);
    expect(row!.label.length).toBeGreaterThan(0);
    expect(row!.args).toEqual(args);
    expect(row!.args).not.toBe(args);
  });
});
