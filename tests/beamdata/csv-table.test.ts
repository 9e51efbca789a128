import { describe, expect, it } from 'vitest';
import { parseCsvTable } from '../../src/beamdata/index.js';

describe('commissioning CSV tables', () => {
  it('reads a grid with comments, blank lines and positions', () => {
    const r = parseCsvTable('# measured 2026-11\n\ndepth\\side,5,10 # header\n1.5,100,100\n10,58.9,67.5\n', 'pdd.csv', 'grid');
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.columns).toEqual([5, 10]);
    expect(r.value.rows).toEqual([1.5, 10]);
    expect(r.value.values).toEqual([100, 100, 58.9, 67.5]);
    expect(r.value.valuePositions[3]).toEqual({ line: 5, column: 9 });
  });
  it('reads semicolon-separated spreadsheets and profiles', () => {
    const r = parseCsvTable('side;sc\n5;0.97\n10;1.000\n', 'sc.csv', 'profile');
    expect(r.ok && r.value.values).toEqual([0.97, 1]);
  });
  it('names file:line:column of a cell that is not a number', () => {
    const r = parseCsvTable('d,5,10\n1.5,100,100\n10,58.9,6x.5\n', 'pdd.csv', 'grid');
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ file: 'pdd.csv', line: 3, column: 9, code: 'invalid-table', found: '"6x.5"' });
  });
  it('refuses a ragged row and a table without data', () => {
    const ragged = parseCsvTable('d,5,10\n1.5,100\n', 'pdd.csv', 'grid');
    expect(!ragged.ok && ragged.issues[0]).toMatchObject({ line: 2, message: 'row has the wrong number of cells' });
    expect(parseCsvTable('# nothing\n', 'x.csv', 'grid').ok).toBe(false);
  });
});
