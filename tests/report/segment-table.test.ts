/** The audit table of a modulated sum in the HTML report: groups of segments that add up to the beam (arithmetic, no source needed). */
import { describe, expect, it } from 'vitest';
import type { Calculation } from '../../src/model/index.js';
import { segmentSection } from '../../src/report/segment-table.js';

type Row = NonNullable<NonNullable<Calculation['modulated']>['segmentRows']>[number];
const row = (gantryDeg: number, doseCGy: number): Row => ({
  gantryDeg,
  muShare: 0.25,
  depthCm: 10,
  sc: 1,
  primaryFluence: 1,
  spTpr: 0.8,
  dosePerMuCGy: doseCGy / 25,
  doseCGy,
});
const calc = (rows: Row[]) => ({ modulated: { segmentRows: rows } }) as unknown as Calculation;

describe('segmentSection', () => {
  it('groups an arc by 30° gantry sectors in delivery order, with each group’s share of the dose', () => {
    const html = segmentSection(calc([row(350, 10), row(355, 10), row(5, 20), row(10, 60)]));
    expect(html.indexOf('gantry 330–360°')).toBeLessThan(html.indexOf('gantry 0–30°'));
    expect(html).toContain('<td class="num">20.00</td><td class="num">20.0</td>');
    expect(html).toContain('<td class="num">80.00</td><td class="num">80.0</td>');
    expect(html).toContain('100.00');
    expect(html).toContain('<svg');
  });
  it('groups a beam at one gantry angle by runs of consecutive segments, and is empty without rows', () => {
    const rows = Array.from({ length: 20 }, () => row(0, 5));
    expect(segmentSection(calc(rows))).toContain('segments 1–2');
    expect(segmentSection({} as Calculation)).toBe('');
  });
});
