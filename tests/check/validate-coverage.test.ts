/**
 * Beam-data checks of reach and plausibility: photon tables covering the field sides and depths the
 * clinic declares it treats; electron effective SSDs within what applicators have (a virtual source
 * below the real one: usually 60–100 cm at SSD 100, common practice, no source).
 */
import { describe, expect, it } from 'vitest';
import { coverageIssues, effectiveSsdIssues } from '../../src/check/validate-coverage.js';
import { demoBeamDataWith } from '../helpers/machines.js';

describe("the clinic's declared range", () => {
  it('is covered by every open-field demo photon table for 3–40 cm fields and 3–30 cm depths: nothing said', () => {
    expect(coverageIssues(demoBeamDataWith((m) => (m.machine.clinicalRange = { fieldSideCm: [3, 40], depthCm: [3, 30] })))).toEqual([]);
  });
  it('a 1 cm field or a 45 cm depth is beyond the tables: each table short of it is named with its edge', () => {
    const issues = coverageIssues(demoBeamDataWith((m) => (m.machine.clinicalRange = { fieldSideCm: [1, 40], depthCm: [3, 45] })));
    const pdd6 = issues.filter((i) => i.file!.endsWith('6x/pdd.csv'));
    expect(pdd6.map((i) => i.found)).toEqual(expect.arrayContaining([expect.stringMatching(/^0–\d+ cm$/), expect.stringMatching(/^3–40 cm$/)]));
    expect(issues.every((i) => i.severity === 'warning')).toBe(true);
    expect(issues.some((i) => i.message.includes('field sides run from 3 to 40 cm'))).toBe(true);
  });
  it('says nothing when the clinic declares no range', () => {
    expect(coverageIssues(demoBeamDataWith(() => {}))).toEqual([]);
  });
});

describe('electron effective SSD', () => {
  it("the demo applicators' are plausible; 120 cm at a nominal 100 cm (a typing slip) is named", () => {
    expect(effectiveSsdIssues(demoBeamDataWith(() => {}))).toEqual([]);
    const slip = effectiveSsdIssues(
      demoBeamDataWith((m) => {
        m.electronBeams[0].applicators[0].effectiveSsdCm = 120;
      }),
    );
    expect(slip).toHaveLength(1);
    expect(slip[0]!.message).toMatch(/effective SSD 120\.0 cm for a nominal SSD of 100 cm/);
  });
});
