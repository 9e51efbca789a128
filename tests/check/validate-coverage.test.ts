/**
 * Beam-data checks of reach and plausibility: photon tables covering the field sides and depths the
 * clinic declares it treats; electron effective SSDs within what applicators have (a virtual source
 * below the real one: usually 60–100 cm at SSD 100, common practice, no source).
 */
import { cpSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { type LoadedMachine, loadMachine } from '../../src/beamdata/index.js';
import { coverageIssues, effectiveSsdIssues } from '../../src/check/validate-coverage.js';
import { DEMO_MANIFEST } from '../helpers/machines.js';

/** The demo beam data copied, its manifest edited. */
function demoWith(edit: (m: Record<string, any>) => void): LoadedMachine {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-cover-'));
  cpSync(dirname(DEMO_MANIFEST), dir, { recursive: true });
  const file = join(dir, 'manifest.json');
  const m = JSON.parse(readFileSync(file, 'utf8'));
  edit(m);
  writeFileSync(file, JSON.stringify(m));
  const r = loadMachine(file);
  if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
  return r.value;
}

describe("the clinic's declared range", () => {
  it('is covered by every open-field demo photon table for 3–40 cm fields and 3–30 cm depths: nothing said', () => {
    expect(coverageIssues(demoWith((m) => (m.machine.clinicalRange = { fieldSideCm: [3, 40], depthCm: [3, 30] })))).toEqual([]);
  });
  it('a 1 cm field or a 45 cm depth is beyond the tables: each table short of it is named with its edge', () => {
    const issues = coverageIssues(demoWith((m) => (m.machine.clinicalRange = { fieldSideCm: [1, 40], depthCm: [3, 45] })));
    const pdd6 = issues.filter((i) => i.file!.endsWith('6x/pdd.csv'));
    expect(pdd6.map((i) => i.found)).toEqual(expect.arrayContaining([expect.stringMatching(/^0–\d+ cm$/), expect.stringMatching(/^3–40 cm$/)]));
    expect(issues.every((i) => i.severity === 'warning')).toBe(true);
    expect(issues.some((i) => i.message.includes('field sides run from 3 to 40 cm'))).toBe(true);
  });
  it('says nothing when the clinic declares no range', () => {
    expect(coverageIssues(demoWith(() => {}))).toEqual([]);
  });
});

describe('electron effective SSD', () => {
  it("the demo applicators' are plausible; 120 cm at a nominal 100 cm (a typing slip) is named", () => {
    expect(effectiveSsdIssues(demoWith(() => {}))).toEqual([]);
    const slip = effectiveSsdIssues(
      demoWith((m) => {
        m.electronBeams[0].applicators[0].effectiveSsdCm = 120;
      }),
    );
    expect(slip).toHaveLength(1);
    expect(slip[0]!.message).toMatch(/effective SSD 120\.0 cm for a nominal SSD of 100 cm/);
  });
});
