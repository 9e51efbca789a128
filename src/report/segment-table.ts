import type { Calculation } from '../model/index.js';

type Row = NonNullable<NonNullable<Calculation['modulated']>['segmentRows']>[number];

/** Gantry sectors of this width group an arc's segments in the table. */
const SECTOR_DEG = 30;
/** Segments at one gantry angle (step-and-shoot, sliding window) are grouped into about this many runs. */
const RUNS = 10;

interface Group {
  readonly label: string;
  readonly rows: readonly Row[];
}

/** An arc's segments by gantry sector; a beam whose gantry stands still, by runs of consecutive segments. */
function groups(rows: readonly Row[]): Group[] {
  const moving = rows.some((r) => r.gantryDeg !== rows[0]!.gantryDeg);
  if (!moving) {
    const size = Math.max(1, Math.ceil(rows.length / RUNS));
    const out: Group[] = [];
    for (let i = 0; i < rows.length; i += size)
      out.push({ label: `segments ${i + 1}–${Math.min(rows.length, i + size)}`, rows: rows.slice(i, i + size) });
    return out;
  }
  const bySector = new Map<number, Row[]>();
  for (const r of rows) {
    const k = Math.floor((((r.gantryDeg % 360) + 360) % 360) / SECTOR_DEG);
    bySector.set(k, [...(bySector.get(k) ?? []), r]);
  }
  // In delivery order: the sectors as the arc first meets them.
  return [...bySector.entries()].map(([k, rs]) => ({ label: `gantry ${k * SECTOR_DEG}–${(k + 1) * SECTOR_DEG}°`, rows: rs }));
}

const sum = (rows: readonly Row[], f: (r: Row) => number) => rows.reduce((s, r) => s + f(r), 0);
/** MU-weighted mean over a group. */
const mean = (rows: readonly Row[], f: (r: Row) => number) => sum(rows, (r) => r.muShare * f(r)) / sum(rows, (r) => r.muShare);

/** Dose per segment against gantry angle (or segment number), as inline SVG bars. */
function contributionPlot(rows: readonly Row[]): string {
  const moving = rows.some((r) => r.gantryDeg !== rows[0]!.gantryDeg);
  const [width, height, left, bottom] = [560, 120, 40, 20];
  const top = Math.max(...rows.map((r) => r.doseCGy));
  if (!(top > 0)) return '';
  const plotW = width - left - 24;
  const plotH = height - bottom - 8;
  const x = (r: Row, i: number) => left + (moving ? (((r.gantryDeg % 360) + 360) % 360) / 360 : i / rows.length) * plotW;
  const barW = Math.max(1, plotW / Math.max(rows.length, 1) - 0.5);
  const bars = rows.map((r, i) => {
    const h = (r.doseCGy / top) * plotH;
    return `<rect x="${x(r, i).toFixed(1)}" y="${(8 + plotH - h).toFixed(1)}" width="${barW.toFixed(1)}" height="${h.toFixed(1)}" fill="#555"/>`;
  });
  const axis = moving ? ['0°', '90°', '180°', '270°', '360°'] : ['first', '', '', '', 'last'];
  const ticks = axis.map((t, i) => `<text x="${left + (i / 4) * plotW}" y="${height - 5}" font-size="10" text-anchor="middle">${t}</text>`);
  return (
    `<figure><svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" role="img" ` +
    `aria-label="dose of each segment at the point">${bars.join('')}` +
    `<line x1="${left}" y1="${8 + plotH}" x2="${left + plotW}" y2="${8 + plotH}" stroke="#000"/>` +
    `<text x="4" y="16" font-size="10">${top.toFixed(2)} cGy</text>${ticks.join('')}</svg>` +
    `<figcaption>Dose at the point from each segment, against ${moving ? 'gantry angle' : 'segment order'}.</figcaption></figure>`
  );
}

/** The audit of a modulated beam's sum: its segments grouped, with their MU, depth, Sc, fluence at the point and dose. */
export function segmentSection(c: Calculation): string {
  const rows = c.modulated?.segmentRows;
  if (!rows?.length) return '';
  const total = sum(rows, (r) => r.doseCGy);
  const body = groups(rows)
    .map((g) => {
      const dose = sum(g.rows, (r) => r.doseCGy);
      return (
        `<tr><td>${g.label}</td><td class="num">${g.rows.length}</td><td class="num">${(100 * sum(g.rows, (r) => r.muShare)).toFixed(1)}</td>` +
        `<td class="num">${mean(g.rows, (r) => r.depthCm).toFixed(2)}</td><td class="num">${mean(g.rows, (r) => r.sc).toFixed(4)}</td>` +
        `<td class="num">${mean(g.rows, (r) => r.primaryFluence).toFixed(3)}</td><td class="num">${mean(g.rows, (r) => r.spTpr).toFixed(4)}</td>` +
        `<td class="num">${dose.toFixed(2)}</td><td class="num">${total > 0 ? ((100 * dose) / total).toFixed(1) : '—'}</td></tr>`
      );
    })
    .join('');
  return (
    `<details><summary>The sum over ${rows.length} segments</summary><table class="calc"><thead><tr><th>segments</th><th>n</th>` +
    `<th>MU %</th><th>depth cm</th><th>Sc</th><th>fluence at point</th><th>Sp·TPR</th><th>dose cGy</th><th>% of beam</th></tr></thead>` +
    `<tbody>${body}</tbody><tfoot><tr class="total"><td>all</td><td class="num">${rows.length}</td><td class="num">100.0</td><td></td><td></td>` +
    `<td></td><td></td><td class="num">${total.toFixed(2)}</td><td class="num">100.0</td></tr></tfoot></table>` +
    `${contributionPlot(rows)}<p class="note">Depth, Sc, fluence and Sp·TPR are MU-weighted means over each group; every segment's ` +
    `row is in the JSON result (<code>calculation.modulated.segmentRows</code>).</p></details>`
  );
}
