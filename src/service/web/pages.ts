import { PlanVerdict } from '../../model/index.js';
import { CAUTION } from '../../report/caution.js';
import { escapeHtml as esc } from '../../report/html-escape.js';
import type { CheckRecord, IntakeOutcome, ReviewRecord, StoredResult } from '../history/store.js';
import type { Session } from './sessions.js';
import { controlLimits } from './control-limits.js';

/** The verdicts in order of severity, as the model defines them. */
export const VERDICTS: readonly PlanVerdict[] = PlanVerdict.options;

const STYLE = `body{font:15px/1.45 system-ui,sans-serif;margin:1.5rem auto;max-width:72rem;padding:0 1rem;color:#1b1b1b}
table{border-collapse:collapse;width:100%}th,td{text-align:left;padding:.3rem .5rem;border-bottom:1px solid #ddd;vertical-align:top}
.v-needs-review{font-weight:600}.v-not-verified{font-weight:700}.v-beyond-action-level{font-weight:700;text-decoration:underline}
.caution{border:1px solid #888;padding:.6rem .8rem;margin:1rem 0;background:#f6f6f6}form.filters label{margin-right:1rem}
.counts span{margin-right:1.5rem}iframe{width:100%;height:60rem;border:1px solid #ccc}svg text{font:11px system-ui,sans-serif}`;

function page(title: string, body: string, who?: Session): string {
  const signedIn = who
    ? `<form id="signout" method="post" action="/signout"><span id="who">${esc(who.user)} (${esc(who.role)})</span>
<input type="hidden" name="csrf" value="${esc(who.csrf)}"> <button type="submit">sign out</button></form>`
    : '';
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>${esc(title)} — plumbline</title><style>${STYLE}</style></head><body>
<header><a href="/">plumbline chart rounds</a>${signedIn}</header><h1>${esc(title)}</h1>${body}<p class="caution" id="caution">${esc(CAUTION)}</p></body></html>`;
}

/** The sign-in form; says how to make the first account when there is none, and why a sign-in failed. */
export function signInPage(noAccounts: boolean, error?: string): string {
  const none = noAccounts
    ? '<p id="no-accounts">No account yet: make one with <code>plumbline users add NAME --role physicist --config C</code>.</p>'
    : '';
  return page(
    'Sign in',
    `${none}${error ? `<p id="signin-error"><b>${esc(error)}</b></p>` : ''}<form id="signin" method="post" action="/signin">
<label>name <input name="name" required maxlength="64" autocomplete="username"></label>
<label>password <input name="password" type="password" required maxlength="1024" autocomplete="current-password"></label>
<button type="submit">sign in</button></form>`,
  );
}

const cls = (v: string) => `v-${v.replace(/ /g, '-')}`;

export interface ListFilter {
  readonly since: string;
  readonly machine?: string;
  readonly verdict?: PlanVerdict;
}

/** One point of the trend: a checked beam's dose deviation at a time, per machine and energy. */
export interface TrendPoint {
  readonly series: string;
  readonly atMs: number;
  readonly deviationPercent: number;
}

/** The chart-round page: checks since a date with verdict counts, filters, and the deviation trend with its control limits. */
export function listPage(
  checks: readonly (CheckRecord & { reviews: number; topCause?: string })[],
  f: ListFilter,
  machines: readonly string[],
  trend: readonly TrendPoint[],
  notChecked: readonly IntakeOutcome[] = [],
  ignoredFilters: readonly string[] = [],
  who?: Session,
): string {
  const counts = VERDICTS.map(
    (v) => `<span class="${cls(v)}" data-verdict="${esc(v)}">${esc(v)}: <b>${checks.filter((c) => c.verdict === v).length}</b></span>`,
  ).join('');
  const option = (value: string, label: string, selected: boolean) =>
    `<option value="${esc(value)}"${selected ? ' selected' : ''}>${esc(label)}</option>`;
  const filters = `<form class="filters" method="get" action="/">
<label>since <input type="date" name="since" value="${esc(f.since)}"></label>
<label>machine <select name="machine">${option('', 'all', !f.machine)}${machines.map((m) => option(m, m, f.machine === m)).join('')}</select></label>
<label>verdict <select name="verdict">${option('', 'all', !f.verdict)}${VERDICTS.map((v) => option(v, v, f.verdict === v)).join('')}</select></label>
<button type="submit">show</button></form>`;
  const rows = checks
    .map(
      (
        c,
      ) => `<tr data-check="${c.id}"><td>${esc(c.recordedAt.replace('T', ' ').slice(0, 16))}</td><td><a href="/check/${c.id}">${esc(c.planLabel)}</a></td>
<td>${esc(c.patientId ?? '—')}</td><td>${esc(c.machine ?? '—')}</td><td
class="${cls(c.verdict)}">${esc(c.verdict)}</td><td class="cause">${esc(c.topCause ?? '')}</td>
<td>${c.fullyVerified ? 'yes' : 'no'}</td><td>${c.reviews}</td></tr>`,
    )
    .join('');
  return page(
    'Checked plans',
    `<p class="counts">${counts}</p>${filters}${
      ignoredFilters.length ? `<p class="note" id="ignored">Not understood, so not applied: ${esc(ignoredFilters.join(', '))}.</p>` : ''
    }
<table id="checks"><thead><tr><th>recorded (UTC)</th><th>plan</th><th>patient</th><th>machine</th><th>verdict</th><th>likely cause</th><th>fully
verified</th><th>reviews</th></tr></thead><tbody>${rows}</tbody></table>
${intakeTable(notChecked)}
<h2>Deviation trend per machine and energy</h2><p>Each point is one checked beam's dose deviation, (independent − planning system) / planning system;
the lines are the mean and the control limits mean ± 3σ of the points shown.</p>
${trendCharts(trend)}`,
    who,
  );
}

/** What arrived and was not checked: refused for its input or failed by an error of ours, each with its reason. */
function intakeTable(outcomes: readonly IntakeOutcome[]): string {
  if (!outcomes.length) return '';
  const rows = outcomes
    .map(
      (o) =>
        `<tr data-intake="${o.id}"><td>${esc(o.recordedAt.replace('T', ' ').slice(0, 16))}</td><td>${esc(o.outcome)}</td>` +
        `<td>${esc(o.callingAeTitle !== undefined ? `received from AE title ${o.callingAeTitle}` : o.fileName)}</td>` +
        `<td>${esc(o.sopInstanceUid ?? '—')}</td><td>${esc(o.reason)}</td></tr>`,
    )
    .join('');
  return `<h2>Arrived, not checked</h2><table id="intake"><thead><tr><th>recorded (UTC)</th><th>outcome</th><th>file or sender</th>
<th>SOP instance</th><th>reason</th></tr></thead><tbody>${rows}</tbody></table>`;
}

/** One SVG per series: the deviations over time, the mean and the ±3σ limits. Text first; lines only as emphasis. */
export function trendCharts(points: readonly TrendPoint[]): string {
  const series = [...new Set(points.map((p) => p.series))].sort();
  if (!series.length) return '<p>No checked beams in this period.</p>';
  return series
    .map((name) => {
      const pts = points.filter((p) => p.series === name).sort((a, b) => a.atMs - b.atMs);
      const lim = controlLimits(pts.map((p) => p.deviationPercent));
      const values = [...pts.map((p) => p.deviationPercent), ...(lim ? [lim.lower, lim.upper] : []), -5, 5];
      const [lo, hi] = [Math.min(...values), Math.max(...values)];
      const [w, h, pad] = [640, 200, 40];
      const t0 = pts[0]!.atMs;
      const span = Math.max(1, pts[pts.length - 1]!.atMs - t0);
      const x = (t: number) => pad + ((t - t0) / span) * (w - 2 * pad);
      const y = (v: number) => h - pad / 2 - ((v - lo) / (hi - lo)) * (h - pad);
      const line = (v: number, label: string, dash: string, left = false) =>
        `<line class="limit" x1="${pad}" x2="${w - pad}" y1="${y(v).toFixed(1)}" y2="${y(v).toFixed(1)}" stroke="#555" ` +
        `stroke-dasharray="${dash}"/><text x="${left ? 2 : w - pad + 4}" y="${(y(v) + 4).toFixed(1)}">${esc(label)}</text>`;
      const summary = lim
        ? `mean ${lim.mean.toFixed(2)} %, σ ${lim.sigma.toFixed(2)} %, limits ${lim.lower.toFixed(2)} % to ${lim.upper.toFixed(2)} %`
        : 'fewer than two points: no control limits';
      const outside = lim ? pts.filter((p) => p.deviationPercent < lim.lower || p.deviationPercent > lim.upper).length : 0;
      return (
        `<figure class="trend" data-series="${esc(name)}"><figcaption>${esc(name)}: ${pts.length} beam(s); ` +
        `${esc(summary)}${outside ? `; ${outside} outside the limits` : ''}</figcaption>
<svg role="img" aria-label="${esc(`deviation trend ${name}`)}" width="${w + 80}" height="${h}" viewBox="0 0 ${w + 80} ${h}">
${line(0, '0 %', '1 3', true)}${
  lim
    ? line(lim.mean, `mean ${lim.mean.toFixed(1)} %`, '6 3') +
      line(lim.upper, `+3σ ${lim.upper.toFixed(1)} ` + `%`, '2 2') +
      line(lim.lower, `−3σ ${lim.lower.toFixed(1)} %`, '2 2')
    : ''
}
${pts
  .map(
    (p) =>
      `<circle class="point" cx="${x(p.atMs).toFixed(1)}" cy="${y(p.deviationPercent).toFixed(1)}" r="3" ` +
      `fill="#1b1b1b"><title>${esc(`${new Date(p.atMs).toISOString().slice(0, 16)}: ${p.deviationPercent.toFixed(2)} %`)}</title></circle>`,
  )
  .join('')}
</svg></figure>`
      );
    })
    .join('');
}

/** One check: its summary, the reviews so far, the review form, and the report itself (as `check --html` writes it). */
/** One review as a list item: when, who, the decision and the comment. */
function reviewItem(r: ReviewRecord): string {
  const comment = r.comment ? ` — ${esc(r.comment)}` : '';
  return `<li>${esc(r.reviewedAt.replace('T', ' ').slice(0, 16))} — ${esc(r.reviewer)}: <b>${r.accepted ? 'accepted' : 'not accepted'}</b>${comment}</li>`;
}

export function checkPage(record: CheckRecord, result: StoredResult, reviews: readonly ReviewRecord[], who?: Session): string {
  const list = reviews.length ? `<ul id="reviews">${reviews.map(reviewItem).join('')}</ul>` : '<p id="reviews">No review yet.</p>';
  return page(
    `${result.planLabel}: ${result.verdict}`,
    `<p>Recorded ${esc(record.recordedAt)}; patient ${esc(record.patientId ?? '—')}; machine ${esc(record.machine ?? '—')};
${result.fullyVerified ? 'every beam checked' : '<b>not fully verified</b>'}; beam data ${esc(record.beamDataVersion ?? '—')}; plumbline
${esc(record.toolVersion)}.</p>
<h2>Reviews</h2>${list}
${reviewForm(record.id, who)}
<h2>Report</h2><iframe title="report" src="/check/${record.id}/report"></iframe>`,
    who,
  );
}

/** A physicist's review form, under their own name; a viewer is told they read only. */
function reviewForm(checkId: number, who: Session | undefined): string {
  if (who?.role !== 'physicist') return '<p id="read-only">Signed in as a viewer: reviews are recorded by physicists.</p>';
  return `<form id="review" method="post" action="/check/${checkId}/review"><input type="hidden" name="csrf" value="${esc(who.csrf)}">
<p>Review as <b>${esc(who.user)}</b>:</p>
<label><input type="radio" name="accepted" value="yes" required> accepted</label> <label><input type="radio" name="accepted" value="no"> not
accepted</label><br>
<label>comment <input name="comment" size="60" maxlength="500"></label> <button type="submit">add review</button></form>
<p>A review is added as a new record; nothing already recorded is ever changed.</p>`;
}

export function notFoundPage(what: string, who?: Session): string {
  return page('Not found', `<p>${esc(what)}</p>`, who);
}
