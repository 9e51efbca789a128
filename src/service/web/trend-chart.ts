import { escapeHtml as esc } from '../../report/html-escape.js';
import { controlLimits } from './control-limits.js';

/** One point of the trend: a checked beam's dose deviation at a time, in a series (machine, energy, technique). */
export interface TrendPoint {
  readonly series: string;
  readonly atMs: number;
  readonly deviationPercent: number;
  /** The beam's verdict was within tolerance: only such beams set the control limits. */
  readonly withinTolerance: boolean;
  readonly checkId: number;
  readonly planLabel: string;
}

const [W, H, PAD, LABELS] = [640, 210, 40, 80];
const DAY = (ms: number) => new Date(ms).toISOString().slice(0, 10);
const minute = (ms: number) => new Date(ms).toISOString().slice(0, 16).replace('T', ' ');

/**
 * Per series, the deviations over time with the mean and the control limits mean ± 3σ, both from
 * the beams within tolerance only (one mis-typed MU must not widen the limits for everyone); the
 * points outside the limits marked, and listed below the chart with their plans.
 */
export function trendCharts(points: readonly TrendPoint[]): string {
  const series = [...new Set(points.map((p) => p.series))].sort();
  if (!series.length) return '<p>No checked beams in this period.</p>';
  return series
    .map((name) =>
      chart(
        name,
        points.filter((p) => p.series === name).sort((a, b) => a.atMs - b.atMs),
      ),
    )
    .join('\n');
}

function chart(name: string, pts: readonly TrendPoint[]): string {
  const lim = controlLimits(pts.filter((p) => p.withinTolerance).map((p) => p.deviationPercent));
  const out = (p: TrendPoint) => !!lim && (p.deviationPercent < lim.lower || p.deviationPercent > lim.upper);
  const values = [...pts.map((p) => p.deviationPercent), ...(lim ? [lim.lower, lim.upper] : []), -5, 5];
  const [lo, hi] = [Math.min(...values), Math.max(...values)];
  const t0 = pts[0]!.atMs;
  const span = Math.max(1, pts[pts.length - 1]!.atMs - t0);
  const x = (t: number) => PAD + ((t - t0) / span) * (W - 2 * PAD);
  const y = (v: number) => H - PAD - ((v - lo) / (hi - lo)) * (H - 1.5 * PAD);
  const line = (v: number, label: string, dash: string, left = false) =>
    `<line class="limit" x1="${PAD}" x2="${W - PAD}" y1="${y(v).toFixed(1)}" y2="${y(v).toFixed(1)}" stroke="#555" ` +
    `stroke-dasharray="${dash}"/><text x="${left ? 2 : W - PAD + 4}" y="${(y(v) + 4).toFixed(1)}">${esc(label)}</text>`;
  const summary = lim
    ? `limits from the ${pts.filter((p) => p.withinTolerance).length} beam(s) within tolerance: mean ${lim.mean.toFixed(2)} %, ` +
      `σ ${lim.sigma.toFixed(2)} %, limits ${lim.lower.toFixed(2)} % to ${lim.upper.toFixed(2)} %`
    : 'fewer than two beams within tolerance: no control limits';
  const outside = pts.filter(out);
  const dots = pts
    .map(
      (p) =>
        `<circle class="point${out(p) ? ' outside' : ''}" cx="${x(p.atMs).toFixed(1)}" cy="${y(p.deviationPercent).toFixed(1)}" ` +
        `r="${out(p) ? 5 : 3}" fill="${out(p) ? 'none' : '#1b1b1b'}" stroke="#1b1b1b" stroke-width="${out(p) ? 2 : 1}">` +
        `<title>${esc(`${p.planLabel}, ${minute(p.atMs)}: ${p.deviationPercent.toFixed(2)} %`)}</title></circle>`,
    )
    .join('');
  const axis =
    `<line x1="${PAD}" x2="${W - PAD}" y1="${H - PAD / 2}" y2="${H - PAD / 2}" stroke="#999"/>` +
    [0, 0.5, 1].map((f) => `<text class="tick" x="${(PAD + f * (W - 2 * PAD) - 30).toFixed(1)}" y="${H - 4}">${DAY(t0 + f * span)}</text>`).join('');
  return `<figure class="trend" data-series="${esc(name)}"><figcaption>${esc(name)}: ${pts.length} beam(s); ${esc(summary)}${
    outside.length ? `; ${outside.length} outside the limits` : ''
  }</figcaption>
<svg role="img" aria-label="${esc(`deviation trend ${name}`)}" width="${W + LABELS}" height="${H}" viewBox="0 0 ${W + LABELS} ${H}">
${line(0, '0 %', '1 3', true)}${
  lim
    ? line(lim.mean, `mean ${lim.mean.toFixed(1)} %`, '6 3') +
      line(lim.upper, `+3σ ${lim.upper.toFixed(1)} %`, '2 2') +
      line(lim.lower, `−3σ ${lim.lower.toFixed(1)} %`, '2 2')
    : ''
}${axis}${dots}</svg>${outsideTable(outside)}</figure>`;
}

/** The beams outside the limits, with their plans. */
function outsideTable(outside: readonly TrendPoint[]): string {
  if (!outside.length) return '';
  const rows = outside
    .map(
      (p) =>
        `<tr><td>${esc(minute(p.atMs))}</td>` +
        `<td><a href="/check/${p.checkId}">${esc(p.planLabel)}</a></td><td class="num">${p.deviationPercent.toFixed(2)} %</td></tr>`,
    )
    .join('');
  return `<table class="outside"><thead><tr><th>recorded (UTC)</th><th>plan</th><th>deviation</th></tr></thead><tbody>${rows}</tbody></table>`;
}
