/** A readable summary of an imported plan: header lines, then a row per beam, each value as the plan states it (invented test plan). */
import { describe, expect, it } from 'vitest';
import { staticBeam } from '../../scripts/fixtures/plan-parts.js';
import { planSummary } from '../../src/report/plan-summary.js';
import { imported, POINT } from '../helpers/plan-bytes.js';

const two = [
  staticBeam(1, 'AP', 6, 0, 900, POINT, { first: { jawsXMm: [-40, 60], jawsYMm: [-50, 70] } }),
  staticBeam(2, 'LAT W30', 10, 90, 920, POINT, { wedge: { id: 'W30', angle: 30, factor: 0.7, orientation: 0 }, first: { wedgeIn: true } }),
];

describe('planSummary', () => {
  const { plan, source } = imported(undefined, two);
  const text = planSummary(plan, source, []);
  it('heads with the label, the date, the approval, the file and its encoding, the patient, the setup', () => {
    expect(text[0]).toBe('RT Plan "UNIT" (unit) 2026-11-30, APPROVED');
    expect(text[1]).toBe('  file: unit.dcm (explicit VR little endian)');
    expect(text[2]).toBe('  patient: UNIT-1, Unit^Test');
    expect(text[3]).toBe('  setups: 1 HFS ISOCENTRIC');
    expect(text).toContain('  dose reference 1 "point": TARGET COORDINATES at (0.0, 0.0, 0.0) mm, prescription 2.000 Gy');
    expect(text).toContain('  fraction group 1: 5 fractions, 2 beam(s), beam dose FRACTION_LEVEL');
  });
  it('a row per beam: its jaws, energy (MV for photons), wedge, MU, dose and SSD', () => {
    const row = (n: string) =>
      text
        .find((l) => l.trim().startsWith(`${n} `))!
        .trim()
        .split(/\s{2,}/);
    expect(row('1')).toEqual([
      '1',
      'AP',
      'photon static',
      '6 MV',
      '0.0',
      '0.0',
      '0.0',
      '-40.0',
      '60.0',
      '-50.0',
      '70.0',
      '—',
      '—',
      '—',
      '—',
      '2',
      '100.00',
      '1.0000',
      '900.0',
    ]);
    expect(row('2')).toContain('W30 30° standard');
    expect(row('2')).toContain('10 MV');
    expect(row('2')).toContain('920.0');
  });
  it('a beam in no fraction group is listed apart; warnings close the summary', () => {
    const { plan: p } = imported((ds) => {
      ds.FractionGroupSequence[0].ReferencedBeamSequence.pop();
      ds.FractionGroupSequence[0].NumberOfBeams = '1';
    }, two);
    const t = planSummary(p, source, [{ severity: 'warning', code: 'missing-attribute', message: 'is missing', path: 'X' }]);
    expect(t).toContain('  beams in no fraction group:');
    expect(t.at(-1)).toMatch(/warning/);
  });
});
