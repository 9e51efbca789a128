/**
 * A machine built from the depth doses of BJR Supplement 25 (1996), Tables 5.2.1-5.5.1, 4-8 MV at
 * SSD 100 cm (read, secondary copy), loaded from CSV and interpolated by the engine.
 */
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { pddAt, photonDosePerMu, tpr2010FromPddRatio } from '../../src/physics/index.js';
import { BJR25_MANIFEST, beam, machine } from '../helpers/machines.js';

const m = machine(BJR25_MANIFEST);

describe('BJR Supplement 25 depth doses as beam data', () => {
  it.each([
    ['4X', 6, 10, 59.7],
    ['4X', 10, 20, 34.1],
    ['5X', 7, 10, 62.9],
    ['6X', 10, 10, 67.5],
    ['6X', 6, 20, 36.4],
    ['8X', 10, 20, 43.4],
  ] as const)('%s, %d cm field, %d cm depth: %d % read back from the table', (id, side, depth, pdd) => {
    expect(pddAt(beam(m, id), depth, side, 100, [])).toBeCloseTo(pdd, 10);
  });

  it('interpolates 6 MV, 8.5 cm field, 10 cm depth to 66.6 % (linear between 65.7 and 67.5; derived, not a published value)', () => {
    expect(pddAt(beam(m, '6X'), 10, 8.5, 100, [])).toBeCloseTo(66.6, 10);
  });

  it('gives TPR20,10 = 0.678 for 6 MV from the table (TRS-398 relation; derived)', () => {
    const b = beam(m, '6X');
    expect(tpr2010FromPddRatio(pddAt(b, 20, 10, 100, []), pddAt(b, 10, 10, 100, []))).toBeCloseTo(0.678, 3);
  });

  it("6 MV 10 x 10 at SSD 100, 10 cm deep: 100 MU give 67.5 cGy at 1 cGy/MU (D = MU · D'0 · PDD/100)", () => {
    const r = photonDosePerMu(beam(m, '6X'), 100, { setup: 'SSD', collimatorFieldCm: { x: 10, y: 10 }, depthCm: 10, ssdCm: 100 });
    expect(r.ok && 100 * r.value.dosePerMuCGy).toBeCloseTo(67.5, 10);
  });

  it('refuses a field whose output factors the source does not give, naming the table and its range', () => {
    const r = photonDosePerMu(beam(m, '6X'), 100, { setup: 'SSD', collimatorFieldCm: { x: 7, y: 7 }, depthCm: 10, ssdCm: 100 });
    expect(r.ok).toBe(false);
    if (!r.ok)
      expect(r.issues[0]!.message).toMatch(/6X sc \(reference-field\.csv\): fieldSide 7\.00 cm is outside the table \(10\.00 to 10\.00 cm\)/);
  });

  it('plumbline calc and beams validate work on it (validate: only the missing dmax rows, exit 1)', () => {
    const run = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', ...args], { encoding: 'utf8' });
    const calc = run('calc', '--beam-data', BJR25_MANIFEST, '--energy', '6', '--setup', 'SSD', '--field', '10', '--depth', '10', '--mu', '100');
    expect(calc.status).toBe(0);
    expect(calc.stdout).toMatch(/dose = 100 MU x 0\.6750 cGy\/MU = 67\.5 cGy/);
    const validate = run('beams', 'validate', BJR25_MANIFEST);
    expect(validate.status).toBe(1);
    expect(validate.stdout.match(/no row at the normalization depth/g)).toHaveLength(4);
  });
});
