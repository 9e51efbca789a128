/**
 * `beams compare-published`: the machine built from BJR Supplement 25's own depth doses agrees with
 * them (exit 0); the same tables 5 % high are flagged (exit 1); beam data that cannot be loaded, exit 2.
 */
import { readFileSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runBeamsComparePublished } from '../../src/cli/beams-compare.js';
import { CAUTION } from '../../src/report/caution.js';
import { BJR25_MANIFEST, machineVariant } from '../helpers/machines.js';

describe('beams compare-published', () => {
  it('BJR 25 against itself: every difference 0.0 %, exit 0, the caution last', () => {
    const o = runBeamsComparePublished(BJR25_MANIFEST);
    expect(o.exitCode).toBe(0);
    const rows = o.stdout.filter((l) => l.trim().startsWith('PDD('));
    expect(rows.length).toBeGreaterThanOrEqual(8);
    for (const r of rows) expect(r).toMatch(/[+-]0\.0 %$/);
    expect(o.stdout.at(-1)).toBe(CAUTION);
  });
  it('the 6 MV tables 5 % high: flagged, exit 1', () => {
    const file = machineVariant(BJR25_MANIFEST, (dir) => {
      const f = join(dir, 'pdd-6mv.csv');
      const text = readFileSync(f, 'utf8').replace(
        /^(\d+),(.*)$/gm,
        (_, d: string, rest: string) =>
          `${d},${rest
            .split(',')
            .map((v) => (Number(v) * 1.05).toFixed(1))
            .join(',')}`,
      );
      writeFileSync(f, text);
    });
    const o = runBeamsComparePublished(file);
    expect(o.exitCode).toBe(1);
    expect(o.stdout.some((l) => l.endsWith('<- look at this table'))).toBe(true);
  });
  it('beam data that cannot be loaded: exit 2, the issue on stderr', () => {
    const o = runBeamsComparePublished('no/such/manifest.json');
    expect(o.exitCode).toBe(2);
    expect(o.stderr.join('\n')).toMatch(/cannot read the manifest/);
  });
});
