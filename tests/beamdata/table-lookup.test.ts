import { describe, expect, it } from 'vitest';
import { makeTableLookup } from '../../src/beamdata/index.js';
import type { LookupLog } from '../../src/model/index.js';

const axis = (name: string, values: number[]) => ({ name, unit: 'cm', values: Float64Array.from(values) });
const plane = (clamp?: object) =>
  makeTableLookup({
    name: 'test grid',
    rows: axis('depth', [0, 10, 20]),
    columns: axis('fieldSide', [5, 10]),
    // v = 2·depth + 3·side: bilinear interpolation must reproduce a plane exactly.
    values: Float64Array.from([15, 30, 35, 50, 55, 70]),
    interpolation: 'bilinear',
    ...(clamp ? { clamp } : {}),
  });

describe('table interpolation', () => {
  it('reproduces a plane exactly (bilinear), at nodes, edges and inside', () => {
    const t = plane();
    const log: LookupLog = [];
    for (const [d, s] of [
      [0, 5],
      [20, 10],
      [7.5, 6.25],
      [13, 9.9],
    ] as const)
      expect(t.at(d, s, log)).toBeCloseTo(2 * d + 3 * s, 12);
    expect(log).toEqual([]);
  });
  it('refuses a lookup outside the range with a note naming table, axis and range', () => {
    const log: LookupLog = [];
    expect(plane().at(25, 7, log)).toBeNaN();
    expect(log).toEqual([{ table: 'test grid', axis: 'depth', requested: 25, used: Number.NaN, kind: 'out-of-range', range: [0, 20], unit: 'cm' }]);
  });
  it('clamps to the edge only within the stated allowance, and says so', () => {
    const t = plane({ columnsAbove: 1 });
    const log: LookupLog = [];
    expect(t.at(10, 10.5, log)).toBe(50);
    expect(log[0]).toMatchObject({ kind: 'clamped', requested: 10.5, used: 10 });
    expect(t.at(10, 11.5, log)).toBeNaN();
    expect(log[1]).toMatchObject({ kind: 'out-of-range' });
  });
  it('refuses NaN rather than interpolating it', () => {
    const log: LookupLog = [];
    expect(plane().at(Number.NaN, 5, log)).toBeNaN();
    expect(log).toHaveLength(1);
  });
  it('log-linear in depth reproduces an exponential exactly', () => {
    const t = makeTableLookup({
      name: 'exp',
      rows: axis('depth', [0, 10, 20]),
      columns: axis('fieldSide', [5, 10]),
      values: Float64Array.from([1, 1, Math.exp(-0.5), Math.exp(-0.5), Math.exp(-1), Math.exp(-1)]),
      interpolation: 'log-linear-rows',
    });
    expect(t.at(3, 7, [])).toBeCloseTo(Math.exp(-0.15), 12);
  });
  it('a one-point axis answers only at its point', () => {
    const t = makeTableLookup({ name: 'ref', rows: axis('fieldSide', [10]), values: Float64Array.from([1]), interpolation: 'bilinear' });
    const log: LookupLog = [];
    expect(t.at(10, 0, log)).toBe(1);
    expect(t.at(10.1, 0, log)).toBeNaN();
  });
  it('a row taken once answers exactly as the full lookup, with the same refusals and clamps', () => {
    const exp = makeTableLookup({
      name: 'exp',
      rows: axis('depth', [0, 10, 20]),
      columns: axis('fieldSide', [5, 10, 20]),
      values: Float64Array.from([1, 1, 1, 0.6, 0.62, 0.65, 0.35, 0.38, 0.41]),
      interpolation: 'log-linear-rows',
      clamp: { columnsAbove: 2, rowsBelow: 0.5 },
    });
    for (const t of [plane({ columnsAbove: 1 }), exp]) {
      for (const depth of [0, 3.3, 10, 17.25, 20, -0.3]) {
        const fromRow: LookupLog = [];
        const row = t.atRow(depth, fromRow);
        for (const side of [5, 6.1, 9.99, 10, 10.5, 12, 21, 25, Number.NaN]) {
          const a: LookupLog = [];
          const b: LookupLog = [];
          const full = t.at(depth, side, a);
          expect(Object.is(row(side, b), full) || (Number.isNaN(full) && Number.isNaN(row(side, [])))).toBe(true);
          // The column's notes come with each lookup; the row's (a clamped depth) once, with the row.
          expect([...fromRow, ...b]).toEqual(expect.arrayContaining(a));
        }
      }
    }
    const refused: LookupLog = [];
    expect(plane().atRow(25, refused)(7, refused)).toBeNaN();
    expect(refused.filter((n) => n.kind === 'out-of-range')).toHaveLength(1);
  });
});
