/**
 * A machine manifest and its tables read into lookups, on the machine of Khan's SSD example (Sc 1.020,
 * Sp 1.010, %DD 65.1 at 10 cm for 15 × 15, read, secondary): each value found where the file puts
 * it, units converted once (mm to cm, a fraction to percent), and every problem an issue with its place.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadMachine } from '../../src/beamdata/load-machine.js';
import type { PhotonBeamModel } from '../../src/model/index.js';
import { demoPlan } from '../helpers/fixtures.js';
import { KHAN_MANIFEST, machineVariant } from '../helpers/machines.js';

const variant = (edit: (dir: string, manifest: any) => void) => machineVariant(KHAN_MANIFEST, edit);

const loaded = (file: string) => {
  const r = loadMachine(file);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.value;
};
const issues = (file: string) => {
  const r = loadMachine(file);
  if (r.ok) throw new Error('loaded');
  return r.issues;
};

describe('loadMachine', () => {
  it("reads Khan's factors where the files put them", () => {
    const m = loaded(KHAN_MANIFEST);
    const b = m.machine.beams[0] as PhotonBeamModel;
    expect(m.machine).toMatchObject({ name: 'KHAN_EXAMPLE', sadCm: 100 });
    expect(b.sc.at(15, 0, [])).toBeCloseTo(1.02, 12);
    expect(b.sp!.at(15, 0, [])).toBeCloseTo(1.01, 12);
    expect(b.pdd!.at(10, 15, [])).toBeCloseTo(65.1, 12);
    expect(m.tables.map((t) => t.quantity).sort()).toEqual(['pdd', 'sc', 'sp']);
    expect(Buffer.from(m.manifestBytes).equals(readFileSync(KHAN_MANIFEST))).toBe(true);
  });
  it('a PDD table in mm and as a fraction is converted once: 100 mm → 10 cm, 0.651 → 65.1 %', () => {
    const file = variant((dir, m) => {
      writeFileSync(join(dir, 'pdd.csv'), 'depth_mm\\field_mm,150\n100,0.651\n');
      m.beams[0].pdd.units = { depth: 'mm', fieldSide: 'mm', value: 'fraction' };
    });
    const b = loaded(file).machine.beams[0] as PhotonBeamModel;
    expect(b.pdd!.at(10, 15, [])).toBeCloseTo(65.1, 12);
  });
  it('a DICOM file given as the manifest is said to be one', () => {
    expect(issues(demoPlan('four-field-box.dcm'))[0]!.message).toMatch(/this is a DICOM file, not a beam-data manifest/);
  });
  it('a manifest that is not JSON, or is missing, is an issue naming it', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-machine-'));
    const bad = join(dir, 'manifest.json');
    writeFileSync(bad, '{ "format": ');
    expect(issues(bad)[0]).toMatchObject({ code: 'invalid-manifest', file: bad });
    expect(issues(join(dir, 'none.json'))[0]).toMatchObject({ code: 'unreadable' });
  });
  it('a table file that is not there names the beam and the quantity', () => {
    const i = issues(variant((_, m) => (m.beams[0].sc.file = 'sc-missing.csv')));
    expect(i[0]).toMatchObject({ code: 'missing-table' });
    expect(i[0]!.message).toMatch(/^4X sc: cannot read the table \(ENOENT\)/);
  });
  it('an axis that is not increasing is refused at its line', () => {
    const i = issues(variant((dir) => writeFileSync(join(dir, 'sc.csv'), 'field_cm,sc\n15,1.02\n10,1.0\n')));
    expect(i[0]).toMatchObject({ code: 'invalid-table', line: 3, expected: 'a value > 15', found: '10' });
    expect(i[0]!.message).toBe('the fieldSide axis is not strictly increasing');
  });
  it('one beam id given twice', () => {
    const i = issues(variant((_, m) => m.beams.push(structuredClone(m.beams[0]))));
    expect(i.some((x) => x.code === 'duplicate' && /beam id 4X is given twice/.test(x.message))).toBe(true);
  });
});
