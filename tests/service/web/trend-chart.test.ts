import { describe, expect, it } from 'vitest';
import { controlLimits } from '../../../src/service/web/control-limits.js';
import { type TrendPoint, trendCharts } from '../../../src/service/web/trend-chart.js';

const point = (deviationPercent: number, k: number, withinTolerance = true): TrendPoint => ({
  series: 'LINAC 6 MV open',
  atMs: Date.UTC(2026, 11, 1 + k),
  deviationPercent,
  withinTolerance,
  checkId: k + 1,
  planLabel: `PLAN ${k}`,
});

describe('the trend chart', () => {
  it('sets its limits from the beams within tolerance only, and marks and lists the beam beyond them', () => {
    const within = [0.4, -0.2, 0.9, -0.6, 0.1];
    const html = trendCharts([...within.map((d, k) => point(d, k)), point(10.3, 5, false)]);
    const lim = controlLimits(within)!;
    expect(html).toContain(`limits ${lim.lower.toFixed(2)} % to ${lim.upper.toFixed(2)} %`);
    expect(html).toContain('limits from the 5 beam(s) within tolerance');
    expect(html.match(/class="point outside"/g)).toHaveLength(1);
    expect(html).toMatch(/<table class="outside">.*<a href="\/check\/6">PLAN 5<\/a>.*10\.30 %/s);
    expect(html).toContain('1 outside the limits');
  });
  it('says when fewer than two beams within tolerance give no limits, and escapes the plan labels', () => {
    const html = trendCharts([{ ...point(1, 0), planLabel: '<b>X</b>' }, point(12, 1, false)]);
    expect(html).toContain('fewer than two beams within tolerance: no control limits');
    expect(html).not.toContain('<b>X</b>');
    expect(trendCharts([])).toBe('<p>No checked beams in this period.</p>');
  });
});
