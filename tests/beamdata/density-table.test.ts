import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadDensityTable } from '../../src/beamdata/density-table.js';

const dir = mkdtempSync(join(tmpdir(), 'plumbline-density-'));
const table = (name: string, body: string) => {
  writeFileSync(join(dir, name), `hu,relative_electron_density\n${body}`);
  return join(dir, name);
};

describe('the HU to density table', () => {
  it('interpolates linearly between its rows and refuses HU outside them (never extrapolated)', () => {
    const t = loadDensityTable(table('ok.csv', '-1000,0\n0,1\n1000,1.5\n'));
    if (!t.ok) throw new Error(t.issues.map((i) => i.message).join('; '));
    expect(t.value.density(-500)).toBeCloseTo(0.5, 12); // halfway between (-1000, 0) and (0, 1), by hand
    expect(t.value.density(500)).toBeCloseTo(1.25, 12);
    expect(t.value.density(-1001)).toBeNaN();
    expect(t.value.huRange).toEqual([-1000, 1000]);
  });
  it('refuses HU not strictly increasing, a negative density, and a file it cannot read', () => {
    const steps = loadDensityTable(table('steps.csv', '-1000,0\n0,1\n0,1.1\n'));
    expect(steps.ok).toBe(false);
    const negative = loadDensityTable(table('negative.csv', '-1000,-0.1\n0,1\n'));
    expect(negative.ok).toBe(false);
    const missing = loadDensityTable(join(dir, 'none.csv'));
    expect(missing.ok ? '' : missing.issues[0]!.message).toMatch(/cannot read the HU to density table \(ENOENT\)/);
  });
});
