import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { CalcDocument } from '../../src/report/calc-report.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
const calc = (...args: string[]) =>
  spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', 'calc', '--beam-data', 'demo', ...args], { cwd: ROOT, encoding: 'utf8' });

describe('plumbline calc on the demo machine', () => {
  it('prints each factor on its own line, the result, the invented-data warning and the caution', () => {
    const r = calc('--energy', '6', '--setup', 'SAD', '--field', '10x12', '--depth', '8.5', '--dose', '200', '--off-axis', '3', '--wedge', 'W30', '--tray');
    expect(r.status).toBe(0);
    for (const label of ["D'0", 'Sc(', 'Sp(', 'TMR(8.5 cm', 'OAR(8.5 cm, 3 cm)', 'WF W30(', 'TF BLOCK_TRAY', 'dose per MU']) expect(r.stdout).toContain(label);
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
