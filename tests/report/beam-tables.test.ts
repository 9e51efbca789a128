/**
 * The beam table and the factor table of a fraction group: each cell the result's number at its
 * shown precision, the factor columns only for the factors some beam has, and a row's factors
 * multiplying to its D/MU. Demo machine (invented values).
 */
import { describe, expect, it } from 'vitest';
import { coordinatesDoseReference, staticBeam } from '../../scripts/fixtures/plan-parts.js';
import type { CheckedBeam } from '../../src/model/index.js';
import { beamTable, FACTOR_LEGEND, factorTable } from '../../src/report/beam-tables.js';
import { check, planFromSpec } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

const iso: [number, number, number] = [0, 0, 0];
const group = check(
  planFromSpec({
    file: 'tables.dcm',
    patientId: 'T-1',
    patientName: 'Tables^Test',
    label: 'TABLES',
    name: 'tables',
    description: 'test',
    doseReferences: [coordinatesDoseReference(1, 'point', iso, 2)],
    fractionGroups: [
      {
        number: 1,
        fractions: 1,
        prescriptionGy: 2,
        beams: [
          { number: 1, mu: 110, doseGy: 1, specPoint: iso },
          { number: 2, mu: 160, doseGy: 1, specPoint: iso },
        ],
      },
    ],
    beams: [
      staticBeam(1, 'AP WITH A LONG NAME', 6, 0, 900, iso),
      staticBeam(2, 'LAT W30', 6, 90, 900, iso, { wedge: { id: 'W30', angle: 30, factor: 0.68, orientation: 0 }, first: { wedgeIn: true } }),
    ],
  }).plan,
  machine(DEMO_MANIFEST),
).fractionGroups[0]!;
const cells = (line: string) => line.trim().split(/\s{2,}/);
const checked = group.beams.filter((b): b is CheckedBeam => b.status === 'checked');

describe('beamTable', () => {
  const rows = beamTable(group);
  it('a row per beam with MU and doses at their shown precision; a long name shortened to 12 characters', () => {
    const header = cells(rows[0]!);
    expect(header).toEqual(['beam', 'name', 'energy', 'setup', 'depth cm', 'MU plan', 'MU indep', 'TPS cGy', 'indep cGy', 'dev %', 'verdict']);
    for (const b of checked) {
      const row = cells(rows.find((l) => l.trim().startsWith(`${b.beamNumber} `))!);
      expect(row[0]).toBe(String(b.beamNumber));
      expect(row[5]).toBe(b.plannedMu!.toFixed(1));
      expect(row[6]).toBe(b.calculation.independentMu!.toFixed(1));
      expect(row[8]).toBe(b.calculation.independentDoseCGy.toFixed(1));
      expect(row[10]).toBe(b.verdict);
    }
    expect(rows.some((l) => l.includes('AP WITH A L…'))).toBe(true);
  });
});

describe('factorTable', () => {
  const rows = factorTable(group);
  const header = cells(rows[0]!);
  it('has a wedge column because one beam is wedged, and none for a tray nobody has', () => {
    expect(header).toContain('WF');
    expect(header).not.toContain('TF');
  });
  it("a row's factors multiply to its D/MU (to the shown precision)", () => {
    const first = header.indexOf('irr cm') + 1;
    const last = header.indexOf('D/MU cGy');
    expect(rows).toHaveLength(1 + checked.length); // the header, then a row per checked beam
    for (const line of rows.slice(1)) {
      const c = cells(line);
      const product = c
        .slice(first, last)
        .map((v, i) => (v === '—' ? 1 : header[first + i] === 'PDD %' ? Number(v) / 100 : Number(v)))
        .reduce((a, b) => a * b, 1);
      expect(product / Number(c[last]) - 1).toBeLessThan(5e-4);
      expect(product / Number(c[last]) - 1).toBeGreaterThan(-5e-4);
    }
  });
  it('the legend explains the short headers', () => {
    for (const h of ['rc', 'irr', 'Sc', 'Sp', 'ISF', 'WF', 'TF', 'CF']) expect(FACTOR_LEGEND).toContain(h);
  });
});
