/** `beams import-scans`: options checked first (each refusal worded), then a PDD table written from two scans (values by hand). */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runImportScans } from '../../src/cli/beams-import.js';

const dir = mkdtempSync(join(tmpdir(), 'plumbline-import-'));
/** A scan: depth (cm) and reading, the maximum 200 at 1.5 cm, falling linearly to 100 at 11.5 cm. */
const scan = (name: string, scale: number) => {
  const f = join(dir, name);
  writeFileSync(
    f,
    Array.from({ length: 31 }, (_, i) => i * 0.5)
      .map((d) => `${d} ${(scale * (d <= 1.5 ? 150 + (50 * d) / 1.5 : 200 - 10 * (d - 1.5))).toFixed(3)}`)
      .join('\n'),
  );
  return f;
};

describe('beams import-scans', () => {
  it('two PDD scans normalised at their maximum: 100 % at 1.5 cm, 50 % at 11.5 cm, written to --out', () => {
    const out = join(dir, 'pdd.csv');
    const o = runImportScans([`10=${scan('a.txt', 1)}`, `20=${scan('b.txt', 2)}`], { quantity: 'pdd', depths: '1.5,11.5', out });
    expect(o.exitCode).toBe(0);
    expect(o.stdout[0]).toMatch(/^wrote .*pdd\.csv from 2 scan\(s\)/);
    const rows = readFileSync(out, 'utf8')
      .split('\n')
      .filter((l) => /^[0-9]/.test(l));
    expect(rows.map((r) => r.split(',').map(Number))).toEqual([
      [1.5, 100, 100],
      [11.5, 50, 50],
    ]);
  });
  it('refuses an unknown quantity, a missing depth grid and a scan not written FIELD=FILE, exit 2', () => {
    const out = join(dir, 'x.csv');
    expect(runImportScans(['10=a.txt'], { quantity: 'tar', depths: '1', out }).stderr.join(' ')).toMatch(/--quantity must be 'pdd', 'tmr' or 'oar'/);
    expect(runImportScans(['10=a.txt'], { quantity: 'pdd', out }).stderr.join(' ')).toMatch(/--depths \(the table's depths, cm\) is needed/);
    const bad = runImportScans(['a.txt'], { quantity: 'pdd', depths: '1', out });
    expect(bad.exitCode).toBe(2);
    expect(bad.stderr.join(' ')).toMatch(/each scan is FIELD=FILE/);
    expect(runImportScans(['10=a.txt'], { quantity: 'pdd', depths: '1;2', out }).stderr.join(' ')).toMatch(
      /--depths must be numbers separated by commas/,
    );
  });
});
