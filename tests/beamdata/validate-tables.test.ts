/**
 * Checks the tables alone can answer, each pointing at file:line:column: a factor table in percent,
 * depths in mm declared as cm, a PDD not 100 % at its normalization depth, a value breaking the
 * smooth run of its neighbours. The demo machine and Khan's example machine pass; each fault is
 * planted in a copy of the demo data (invented values), so only the planted fault can be found.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadMachine } from '../../src/beamdata/load-machine.js';
import { validateTables } from '../../src/beamdata/validate-tables.js';
import { DEMO_MANIFEST, KHAN_MANIFEST, machineVariant } from '../helpers/machines.js';

const validate = (file: string) => {
  const r = loadMachine(file);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return validateTables(r.value);
};
const errors = (file: string) => validate(file).filter((i) => i.severity === 'error');
/** The demo data with one 6X table rewritten cell by cell: `cell(value, row, column)` for the data rows. */
const demoWith = (table: string, cell: (value: number, row: number, column: number) => number) =>
  machineVariant(DEMO_MANIFEST, (dir) => {
    const f = join(dir, '6x', table);
    const lines = readFileSync(f, 'utf8').split('\n');
    const firstData = lines.findIndex((l) => /^[0-9]/.test(l));
    const out = lines.map((l, i) =>
      i < firstData || !l
        ? l
        : l
            .split(',')
            .map((v, j) => (j === 0 ? v : String(cell(Number(v), i - firstData, j - 1))))
            .join(','),
    );
    writeFileSync(f, out.join('\n'));
  });

describe('validateTables', () => {
  it("the demo machine and Khan's example machine raise no error", () => {
    expect(errors(DEMO_MANIFEST)).toEqual([]);
    expect(errors(KHAN_MANIFEST)).toEqual([]);
  });
  it('Sp given in percent: "percent?", at its place', () => {
    const e = errors(demoWith('sp.csv', (v) => Number((v * 100).toFixed(2))));
    expect(e[0]!.message).toMatch(/^6X sp: values between 95\.54 and .* in a table of factors: percent\?$/);
    expect(e[0]!.file).toMatch(/6x[\\/]sp\.csv$/);
    expect(e[0]!.line).toBeGreaterThan(0);
  });
  it('PDD depths in mm in a table declared in cm: "millimetres?"', () => {
    const file = machineVariant(DEMO_MANIFEST, (dir) => {
      const f = join(dir, '6x', 'pdd.csv');
      const lines = readFileSync(f, 'utf8').split('\n');
      writeFileSync(f, lines.map((l) => (/^[0-9]/.test(l) ? l.replace(/^[^,]+/, (d) => String(Number(d) * 10)) : l)).join('\n'));
    });
    expect(errors(file).some((x) => /^6X pdd: depth up to \d+ in a table declared in cm: millimetres\?$/.test(x.message))).toBe(true);
  });
  it('a PDD 1 % high everywhere is not 100 at its normalization depth', () => {
    const e = errors(demoWith('pdd.csv', (v) => Number((v * 1.01).toFixed(2))));
    expect(e.some((x) => /^6X pdd is not 100 at its normalization depth 1\.5 cm$/i.test(x.message))).toBe(true);
  });
  it('one PDD cell 3 % off its neighbours is a rough table, that cell named', () => {
    const w = validate(demoWith('pdd.csv', (v, row, column) => (row === 12 && column === 6 ? Number((v * 1.03).toFixed(2)) : v)));
    const rough = w.filter((x) => x.code === 'rough-table');
    expect(rough).toHaveLength(1);
    expect(rough[0]!.column).toBeGreaterThan(1);
  });
});
