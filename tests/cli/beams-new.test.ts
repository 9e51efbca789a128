/**
 * `beams new`: a new machine's manifest and CSV templates written into a new folder; options refused
 * with their reason; a folder with files never overwritten.
 */
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runBeamsNew } from '../../src/cli/beams-new.js';
import { CAUTION } from '../../src/report/caution.js';

describe('beams new', () => {
  it('writes the manifest, its tables and a README for 6 MV and 9 MeV with applicator A10 (side read from its ID)', () => {
    const out = join(mkdtempSync(join(tmpdir(), 'plumbline-new-')), 'LINAC_X');
    const o = runBeamsNew({ machine: 'LINAC_X', photons: '6', electrons: '9', applicators: 'A10', out });
    expect(o.exitCode).toBe(0);
    expect(o.stdout.at(-1)).toBe(CAUTION);
    const manifest = JSON.parse(readFileSync(join(out, 'manifest.json'), 'utf8'));
    expect(manifest.machine.name).toBe('LINAC_X');
    expect(existsSync(join(out, 'README.md'))).toBe(true);
    expect(JSON.stringify(manifest)).toContain('A10');
  });
  it('refuses no energy, electrons without applicators, a name with a space, an applicator without a side', () => {
    expect(runBeamsNew({ machine: 'M' }).stderr.join(' ')).toMatch(/give at least one energy/);
    expect(runBeamsNew({ machine: 'M', electrons: '9' }).stderr.join(' ')).toMatch(/electron beams need their applicators/);
    expect(runBeamsNew({ machine: 'LINAC 1', photons: '6' }).stderr.join(' ')).toMatch(/--machine must be the Treatment Machine Name/);
    expect(runBeamsNew({ machine: 'M', electrons: '9', applicators: 'CONE' }).stderr.join(' ')).toMatch(/the side of applicator CONE cannot be read/);
  });
  it('never writes into a folder that already holds files', () => {
    const out = mkdtempSync(join(tmpdir(), 'plumbline-new-'));
    writeFileSync(join(out, 'keep.txt'), 'mine');
    const o = runBeamsNew({ machine: 'M', photons: '6', out });
    expect(o.exitCode).toBe(2);
    expect(o.stderr.join(' ')).toMatch(/already holds files/);
    expect(readFileSync(join(out, 'keep.txt'), 'utf8')).toBe('mine');
  });
});
