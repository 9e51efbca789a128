/**
 * Beam data are validated before any use: data with a transcription error are refused, never used
 * to give plausible, wrong verdicts. Each mistake is one a physicist could make typing commissioning
 * tables (common practice, no source): Sc scaled by 2 %, Sp typed in percent, PDD depths in mm
 * under a header that says cm.
 */
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { beamDataStamp, loadBeamData } from '../../src/run/index.js';
import { manifestPath } from '../helpers/machines.js';

/** A copy of the demo machine with one table's data rows rewritten (comment and header lines kept). */
function demoWith(table: string, row: (cells: string[]) => string[]): string {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-beamdata-'));
  cpSync(manifestPath('fixtures/demo/beam-data'), dir, { recursive: true });
  const file = join(dir, table);
  const lines = readFileSync(file, 'utf8').split('\n');
  let header = false;
  const out = lines.map((l) => {
    if (l.startsWith('#') || !l.trim()) return l;
    if (!header) {
      header = true;
      return l;
    }
    return row(l.split(',')).join(',');
  });
  writeFileSync(file, out.join('\n'));
  return join(dir, 'manifest.json');
}
const scaled = (f: number) => (cells: string[]) => [cells[0]!, ...cells.slice(1).map((c) => (Number(c) * f).toFixed(4))];

describe('validation gates every use of beam data', () => {
  it('the demo machine passes, and its stamp says so with its approval', () => {
    const r = loadBeamData('demo');
    expect(r.ok && r.warnings).toBeFalsy();
    if (!r.ok) throw new Error('refused');
    expect(beamDataStamp(r.value)).toMatchObject({ validationWarnings: 0, approvedOn: '2026-12-02' });
  });

  const cases: [string, string, (cells: string[]) => string[], RegExp][] = [
    ['Sc scaled by 1.02', '6x/sc.csv', scaled(1.02), /Sc of the reference field/],
    [
      'a PDD typed as fractions',
      '6x/pdd.csv',
      (c) => [c[0]!, ...c.slice(1).map((v) => (Number(v) / 100).toFixed(4))],
      /^6X pdd: values between .* declared as percent: fractions\?$/m,
    ],
    ['Sp typed in percent', '6x/sp.csv', scaled(100), /^6X sp: values between 95\.\d+ and 10\d\.\d+ in a table of factors: percent\?$/m],
    [
      'PDD depths in mm declared as cm',
      '6x/pdd.csv',
      (c) => [String(Number(c[0]) * 10), ...c.slice(1)],
      /^6X pdd: depth up to 350 in a table declared in cm: millimetres\?$/m,
    ],
  ];
  for (const [what, table, row, first] of cases) {
    it(`${what}: refused, the first problems listed and \`beams validate\` named for the rest`, () => {
      const manifest = demoWith(table, row);
      const r = loadBeamData(manifest);
      expect(r.ok).toBe(false);
      if (r.ok) return;
      expect(
        r.issues
          .slice(0, -1)
          .map((i) => i.message)
          .join('\n'),
      ).toMatch(first);
      expect(r.issues.length).toBeLessThanOrEqual(6);
      expect(r.issues.at(-1)!.message).toMatch(/fail their validation .* run `plumbline beams validate .*manifest\.json` for the full list/);
    });
  }
});

describe('the wedge heel pair', () => {
  // IEC 61217: positive rotations are counterclockwise seen from the positive end of the axis (here the source), so
  // a quarter turn takes −Y to +X (the demo machine) and +Y to −X; +Y with +X reads one of them in the other sense.
  const withHeel = (atOrientation0: string, atOrientation90: string) => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-heel-'));
    cpSync(manifestPath('fixtures/demo/beam-data'), dir, { recursive: true });
    const file = join(dir, 'manifest.json');
    const m = JSON.parse(readFileSync(file, 'utf8'));
    m.machine.wedgeHeel = { atOrientation0, atOrientation90 };
    writeFileSync(file, JSON.stringify(m));
    return loadBeamData(file);
  };
  it('+Y with +X is refused; −Y with +X and +Y with −X pass', () => {
    const bad = withHeel('+Y', '+X');
    expect(!bad.ok && bad.issues[0]).toMatchObject({ path: 'machine.wedgeHeel', found: '+Y with +X' });
    expect(withHeel('-Y', '+X').ok).toBe(true);
    expect(withHeel('+Y', '-X').ok).toBe(true);
  });
});

describe('messages that guide', () => {
  const manifestWith = (edit: (m: any) => void) => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-keys-'));
    cpSync(manifestPath('fixtures/demo/beam-data'), dir, { recursive: true });
    const file = join(dir, 'manifest.json');
    const m = JSON.parse(readFileSync(file, 'utf8'));
    edit(m);
    writeFileSync(file, JSON.stringify(m));
    return file;
  };
  it('an unknown key names the known key it most likely meant', () => {
    const file = manifestWith((m) => {
      m.beams[0].pdd.normalisationDepthCm = m.beams[0].pdd.normalizationDepthCm;
      delete m.beams[0].pdd.normalizationDepthCm;
    });
    const r = loadBeamData(file);
    expect(!r.ok && r.issues.map((i) => i.message)).toContain('unknown key "normalisationDepthCm": did you mean "normalizationDepthCm"?');
  });
  it('a DICOM file passed as beam data is said to be one, its bytes never echoed', () => {
    const r = loadBeamData(manifestPath('fixtures/demo/clinic/brain-laterals.dcm'));
    expect(!r.ok && r.issues.map((i) => i.message)).toEqual([expect.stringMatching(/^this is a DICOM file, not a beam-data manifest/)]);
  });
});
