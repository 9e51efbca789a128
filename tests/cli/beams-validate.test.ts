/**
 * `plumbline beams validate` on the demo machine (clean) and on copies of it with one fault each:
 * every fault must be found, at its file:line:column, with the right exit code.
 */
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runBeamsValidate } from '../../src/cli/beams-validate.js';
import { runBeamsNew } from '../../src/cli/beams-new.js';
import { DEMO_BEAM_DATA_DIR } from '../helpers/fixtures.js';

/** A copy of the demo beam data with `edit` applied to one file's text. */
function faulty(file: string, edit: (text: string) => string): string {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-bd-'));
  cpSync(DEMO_BEAM_DATA_DIR, dir, { recursive: true });
  const p = join(dir, file);
  writeFileSync(p, edit(readFileSync(p, 'utf8')));
  return join(dir, 'manifest.json');
}
/** Replaces the cell in the row starting with `rowKey` at column index `col` (0 = the row axis). */
const setCell = (rowKey: string, col: number, value: string) => (text: string) =>
  text
    .split('\n')
    .map((l) => {
      if (!l.startsWith(`${rowKey},`)) return l;
      const cells = l.split(',');
      cells[col] = value;
      return cells.join(',');
    })
    .join('\n');

const lines = (out: { stdout: readonly string[] }) => out.stdout.join('\n');

describe('plumbline beams validate', () => {
  it('finds nothing wrong with the demo machine (exit 0)', () => {
    const r = runBeamsValidate('demo');
    expect(lines(r)).toMatch(/3 photon and 3 electron beam\(s\), 72 table\(s\), 0 error\(s\), 0 warning\(s\)/);
    expect(r.exitCode).toBe(0);
  });

  it('a spike in the PDD: rough table at its cell, and PDD and TMR that no longer agree (exit 2)', () => {
    // 6x/pdd.csv row "10" (line 17), column 10 cm is the 8th cell: 67.50 -> 69.50.
    const r = runBeamsValidate(faulty('6x/pdd.csv', setCell('10', 7, '69.50')));
    const text = lines(r);
    expect(text).toMatch(/6x\/pdd\.csv:17:\d+: 6X pdd: the value breaks the smooth run.*\[rough-table\]/);
    expect(text).toMatch(
      /6x\/pdd\.csv:17:\d+: beam 6X: PDD at 10 cm for 10 cm converted to TMR differs from the TMR table by 3\.\d+ %.*\[tables-disagree\]/,
    );
    expect(r.exitCode).toBe(2);
  });

  it('a PDD above 100 %', () => {
    const r = runBeamsValidate(faulty('10x/pdd.csv', setCell('5', 3, '100.90')));
    expect(lines(r)).toMatch(/10x\/pdd\.csv:\d+:\d+: 10X pdd: value outside the physical range; expected > 0 and <= 100\.05 %, found 100\.9/);
    expect(r.exitCode).toBe(2);
  });

  it('an electron PDD column not normalized to 100 % at its own dmax, at the cell of its maximum', () => {
    // Every value of the 3 cm cutout column (cell 1) of 9 MeV scaled by 0.97.
    const r = runBeamsValidate(
      faulty('9e/pdd.csv', (t) =>
        t
          .split('\n')
          .map((l) =>
            /^\d/.test(l)
              ? l
                  .split(',')
                  .map((c, k) => (k === 1 ? (0.97 * Number(c)).toFixed(2) : c))
                  .join(',')
              : l,
          )
          .join('\n'),
      ),
    );
    expect(lines(r)).toMatch(
      /9e\/pdd\.csv:\d+:\d+: 9E electron PDD: the column's maximum is not 100 % \(each column is normalized at its own dmax\); expected 100 ± 0\.5 %, found 97/,
    );
    expect(r.exitCode).toBe(2);
  });

  it('a depth axis that is not strictly increasing', () => {
    const r = runBeamsValidate(faulty('15x/tmr.csv', (t) => t.replace('\n12,', '\n11,').replace('\n10,', '\n11,')));
    expect(lines(r)).toMatch(/15x\/tmr\.csv:\d+:1: the depth axis is not strictly increasing; expected a value > 11, found 11/);
    expect(r.exitCode).toBe(2);
  });

  it('Sc of the reference field that is not 1', () => {
    const r = runBeamsValidate(faulty('6x/sc.csv', setCell('10', 1, '1.0200')));
    expect(lines(r)).toMatch(
      /beam 6X: Sc of the reference field \(10\.00 cm, as defined at the surface\) is not 1; expected 1\.000 ± 0\.005, found 1\.0200/,
    );
  });

  it('a TMR that is not 1 at its normalization depth', () => {
    const r = runBeamsValidate(faulty('6x/tmr.csv', setCell('1.5', 4, '0.9900')));
    expect(lines(r)).toMatch(/6X TMR is not 1 at its normalization depth 1\.5 cm; expected 1 ± 0\.005, found 0\.99/);
  });

  it('a wedge that one energy lacks is a warning (exit 1)', () => {
    const r = runBeamsValidate(
      faulty('manifest.json', (t) => {
        const m = JSON.parse(t);
        m.beams[1].wedges = m.beams[1].wedges.filter((w: { id: string }) => w.id !== 'W45');
        return JSON.stringify(m);
      }),
    );
    expect(lines(r)).toMatch(/wedge W45 has data for some beams but not for 10X/);
    expect(r.exitCode).toBe(1);
  });

  it('a manifest that names a missing table, or breaks the schema, is refused with the path', () => {
    const missing = runBeamsValidate(faulty('manifest.json', (t) => t.replace('"6x/oar.csv"', '"6x/oar-missing.csv"')));
    expect(lines(missing)).toMatch(/oar-missing\.csv: 6X oar: cannot read the table \(ENOENT\)/);
    const schema = runBeamsValidate(faulty('manifest.json', (t) => t.replace('"referenceFieldAt": "surface"', '"referenceFieldAt": "skin"')));
    expect(lines(schema)).toMatch(/beams\[0\]\.calibration\.referenceFieldAt/);
    expect(schema.exitCode).toBe(2);
  });
});

describe('plumbline beams new', () => {
  it('writes a manifest and templates that validation refuses until filled, each null named as still to fill', () => {
    const out = join(mkdtempSync(join(tmpdir(), 'plumbline-new-cli-')), 'linac2');
    const made = runBeamsNew({ machine: 'LINAC2', photons: '6,10', electrons: '9', applicators: 'A10,CONE6=6', out });
    expect(made.exitCode).toBe(0);
    expect(readFileSync(join(out, 'README.md'), 'utf8')).toMatch(/plumbline beams validate manifest\.json/);
    expect(readFileSync(join(out, '9e/se-cone6.csv'), 'utf8')).toMatch(/^cutout_cm,se\n3,\n4,\n5,\n6,\n$/m);
    const v = runBeamsValidate(join(out, 'manifest.json'));
    expect(v.exitCode).toBe(2);
    expect(v.stdout.join('\n')).toMatch(/beams\[0\]\.calibration\.doseCGyPerMu: still to fill \(expected number, received null\)/);
    expect(runBeamsNew({ machine: 'LINAC2', photons: '6', out }).exitCode).toBe(2); // the folder now holds files
    expect(runBeamsNew({ machine: 'LINAC2', electrons: '6', applicators: 'CONE', out: `${out}-2` }).stderr.join()).toMatch(/CONE=side in cm/);
  });
});
