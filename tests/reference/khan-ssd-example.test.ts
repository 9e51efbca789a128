/**
 * Khan, The Physics of Radiation Therapy, SSD MU example (inputs read, secondary: course notes
 * reproducing the textbook; the textbook's "298 MU" from memory): 200 cGy at 10 cm depth,
 * 15 x 15 cm at SSD 100 cm, 1 cGy/MU at dmax for 10 x 10, Sc = 1.020, Sp = 1.010, %DD = 65.1
 * -> MU = 200 / (1.020 · 1.010 · 0.651) = 298.2. The machine in khan-ssd-example/ holds exactly
 * these factors; Sp at 15.15 cm (TG-71 takes Sp at d0) is clamped to the 15 cm value, as stated.
 */
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { muForDose, photonDosePerMu } from '../../src/physics/index.js';
import { CalcDocument } from '../../src/report/calc-report.js';
import { KHAN_MANIFEST, beam, machine } from '../helpers/machines.js';

describe("Khan's SSD example", () => {
  const m = machine(KHAN_MANIFEST);
  it('needs 298 MU for 200 cGy (298.2 before rounding), within 0.1 MU', () => {
    const r = photonDosePerMu(beam(m, '4X'), m.sadCm, { setup: 'SSD', collimatorFieldCm: { x: 15, y: 15 }, depthCm: 10, ssdCm: 100 });
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(muForDose(r.value, 200)).toBeCloseTo(298.2, 1);
    expect(Math.round(muForDose(r.value, 200))).toBe(298);
    expect(r.value.factors.map((f) => f.key)).toEqual(['D0', 'Sc', 'Sp', 'PDD', 'ISF']);
    [1, 1.02, 1.01, 0.651, 1].forEach((v, i) => expect(r.value.factors[i]!.value).toBeCloseTo(v, 12));
    expect(r.value.clamps).toEqual([expect.objectContaining({ kind: 'clamped', table: '4X sp (sp.csv)', requested: 15.15, used: 15 })]);
  });

  it('gives the same through `plumbline calc --json`, the interface for checking the engine from outside', () => {
    const out = spawnSync(
      process.execPath,
      [
        '--import',
        'tsx',
        'src/cli/bin.ts',
        'calc',
        '--beam-data',
        KHAN_MANIFEST,
        '--energy',
        '4',
        '--setup',
        'SSD',
        '--field',
        '15x15',
        '--depth',
        '10',
        '--dose',
        '200',
        '--json',
      ],
      { encoding: 'utf8' },
    );
    expect(out.status).toBe(0);
    const doc = CalcDocument.parse(JSON.parse(out.stdout));
    expect(doc.mu).toBeCloseTo(298.2, 1);
    expect(doc.given).toBe('dose');
  });
});
