import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { CalcDocument } from '../../src/report/calc-report.js';
import { ElectronCalcDocument } from '../../src/report/electron-calc-report.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const calc = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', 'calc', '--beam-data', 'demo', ...args], { cwd: ROOT, encoding: 'utf8' });

describe('plumbline calc on the demo machine', () => {
  it('prints each factor on its own line, the result, the invented-data warning and the caution', () => {
    const r = calc(
      '--energy',
      '6',
      '--setup',
      'SAD',
      '--field',
      '10x12',
      '--depth',
      '8.5',
      '--dose',
      '200',
      '--off-axis',
      '3',
      '--wedge',
      'W30',
      '--tray',
    );
    expect(r.status).toBe(0);
    for (const label of ["D'0", 'Sc(', 'Sp(', 'TMR(8.5 cm', 'OAR(8.5 cm, 3 cm)', 'WF W30(', 'TF BLOCK_TRAY', 'dose per MU'])
      expect(r.stdout).toContain(label);
    expect(r.stdout).toMatch(/MU = 200 cGy \/ \d\.\d{4} cGy\/MU = \d+\.\d MU/);
    expect(r.stdout).toMatch(/SSD 91\.5 cm \(SAD − depth: the point at the isocenter, none given\)/);
    expect(r.stdout).toMatch(/INVENTED DEMO DATA, never for a patient/);
    expect(r.stdout).toMatch(/an aid to, never a replacement for/);
  });

  it('--json prints a document its schema accepts, whose factors multiply to the dose per MU', () => {
    const r = calc('--energy', '10', '--setup', 'SSD', '--field', '15', '--depth', '5', '--ssd', '95', '--mu', '150', '--json');
    expect(r.status).toBe(0);
    const doc = CalcDocument.parse(JSON.parse(r.stdout));
    expect(doc.factors.reduce((p, f) => p * f.value, 1)).toBeCloseTo(doc.dosePerMuCGy, 12);
    expect(doc.doseCGy).toBeCloseTo(150 * doc.dosePerMuCGy, 10);
  });

  it.each([
    [['--energy', '7', '--setup', 'SAD', '--field', '10', '--depth', '10', '--mu', '100'], /no 7 MV photon beam.*expected 6 MV, 10 MV, 15 MV/],
    [['--energy', '6', '--setup', 'SAD', '--field', '10', '--depth', '10'], /give exactly one of --mu and --dose/],
    [['--energy', '6', '--setup', 'ISO', '--field', '10', '--depth', '10', '--mu', '1'], /--setup must be SAD or SSD/],
    [['--energy', '6', '--setup', 'SAD', '--field', '10by12', '--depth', '10', '--mu', '1'], /--field must be XxY in cm/],
    [['--energy', '6', '--setup', 'SAD', '--field', '10', '--depth', '45', '--mu', '1'], /outside the table/],
    [['--energy', '6', '--setup', 'SAD', '--field', '10', '--depth', '10', '--mu', '1', '--wedge', 'W90'], /no wedge "W90"/],
  ] as const)('refuses %j with exit 2 and one line saying why', (args, message) => {
    const r = calc(...args);
    expect(r.status).toBe(2);
    expect(r.stderr).toMatch(message);
    expect(r.stdout).toBe('');
  });
});

describe('plumbline calc for electrons', () => {
  const run = (...args: string[]) =>
    spawnSync(
      process.execPath,
      ['--import', 'tsx', 'src/cli/bin.ts', 'calc', '--beam-data', 'tests/reference/electron-course-examples/manifest.json', ...args],
      { cwd: ROOT, encoding: 'utf8' },
    );
  it('prescribed to the 90 % isodose: the published worked example 2.2 (9 MeV, 10x10 cone, 8x10 cutout, 200 cGy → 220 MU)', () => {
    const r = run('--energy', '9', '--applicator', 'A10', '--cutout', '8x10', '--isodose', '90', '--dose', '200');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/depth 2\.90 cm \(the depth of the 90 % isodose on the central axis\)/);
    expect(r.stdout).toMatch(/MU = 200 cGy \/ \d\.\d{4} cGy\/MU = 219\.\d MU/);
    expect(r.stdout).toMatch(/an aid to, never a replacement for/);
  });
  it('--json at an extended SSD: example 2.4 (9x15 cutout in the 15x15 cone, SSD 105 cm → 221 MU), a document its schema accepts', () => {
    const r = run('--energy', '9', '--applicator', 'A15', '--cutout', '9x15', '--depth', '2.2', '--ssd', '105', '--dose', '200', '--json');
    expect(r.status).toBe(0);
    const doc = ElectronCalcDocument.parse(JSON.parse(r.stdout));
    expect(Math.round(doc.mu)).toBe(221);
    expect(doc.airGapCm).toBeCloseTo(5, 9);
    expect(doc.factors.reduce((p, f) => p * f.value, 1)).toBeCloseTo(doc.dosePerMuCGy, 12);
  });
  it('refuses an applicator the beam data lack, naming those it has, and --isodose for photons', () => {
    expect(run('--energy', '9', '--applicator', 'A25', '--depth', '2', '--dose', '200').stderr).toMatch(/no applicator "A25".*expected A10, A15/);
    const p = calc('--energy', '6', '--setup', 'SSD', '--field', '10', '--depth', '5', '--isodose', '90', '--dose', '200');
    expect(p.status).toBe(2);
    expect(p.stderr).toMatch(/--cutout and --isodose are for electron beams/);
  });
});

describe('what the calculation rests on', () => {
  it('names the beam data, their hash, that they passed validation and who approved them, as the check does', () => {
    const r = calc('--energy', '6', '--setup', 'SAD', '--field', '10x10', '--depth', '10', '--mu', '100');
    expect(r.status).toBe(0);
    expect(r.stdout).toMatch(/beam data NG_LINAC1, version demo-2026-12-02 .*SHA-256 [0-9a-f]{16}…; validated, no warnings; approved 2026-12-02 by/);
  });
});
