import { PlanVerdict } from '../../model/index.js';
import { CAUTION } from '../../report/caution.js';
import { escapeHtml as esc } from '../../report/html-escape.js';
import { planHeadline } from '../../report/plan-headline.js';
import { signed } from '../../report/table.js';
import type { ChartRoundEntry } from '../history/chart-round.js';
import type { CheckRecord, IntakeOutcome, ReviewRecord, StoredResult } from '../history/store.js';
import type { Session } from './sessions.js';
import { type TrendPoint, trendCharts } from './trend-chart.js';

export type { TrendPoint } from './trend-chart.js';

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
<header><a href="/">plumbline chart rounds</a>${signedIn}</header><h1>${esc(title)}</h1>${body}
<p class="caution" id="caution">${esc(CAUTION)}</p></body></html>`;
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

/** The chart-round page: checks since a date with verdict counts, filters, and the deviation trend with its control limits. */
/** What the chart-round page shows. */
export interface ListView {
  /** Checks wanting a physicist and not yet reviewed, oldest first, whatever the filters. */
  readonly queue: readonly ChartRoundEntry[];
  readonly checks: readonly (CheckRecord & { reviews: number; topCause?: string })[];
  readonly filter: ListFilter;
  readonly machines: readonly string[];
  readonly trend: readonly TrendPoint[];
  readonly notChecked: readonly IntakeOutcome[];
  readonly ignoredFilters: readonly string[];
  readonly who?: Session;
}

/** The "to review" queue: each check with its patient, plan, machine, verdict, worst beam and its deviation. */
function queueTable(queue: readonly ChartRoundEntry[]): string {
  if (!queue.length) return '<h2>To review</h2><p id="queue">Nothing waits for a review.</p>';
  const rows = queue
    .map(
      (e) =>
        `<tr data-check="${e.check.id}"><td>${esc(e.check.recordedAt.replace('T', ' ').slice(0, 16))}</td><td>${esc(e.check.patientId ?? '—')}</td>` +
        `<td><a href="/check/${e.check.id}">${esc(e.check.planLabel)}</a></td><td>${esc(e.check.machine ?? '—')}</td>` +
        `<td class="${cls(e.check.verdict)}">${esc(e.check.verdict)}${e.check.fullyVerified ? '' : ' (not fully verified)'}</td>` +
        `<td>${e.worst ? `beam ${e.worst.beamNumber ?? '?'}: ${signed(e.worst.deviationPercent, 1)} %` : '—'}</td>` +
        `<td class="cause">${esc(e.topCause ?? '')}</td></tr>`,
    )
    .join('');
  return `<h2>To review</h2><table id="queue"><thead><tr><th>recorded (UTC)</th><th>patient</th><th>plan</th><th>machine</th><th>verdict</th>
<th>worst beam</th><th>likely cause</th></tr></thead><tbody>${rows}</tbody></table>`;
}

export function listPage(v: ListView): string {
  const { checks, filter: f, machines, trend, notChecked, ignoredFilters, who } = v;
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
    'Chart rounds',
    `${queueTable(v.queue)}<h2>Checked plans</h2><p class="counts">${counts}</p>${filters}${
      ignoredFilters.length ? `<p class="note" id="ignored">Not understood, so not applied: ${esc(ignoredFilters.join(', '))}.</p>` : ''
    }
<table id="checks"><thead><tr><th>recorded (UTC)</th><th>plan</th><th>patient</th><th>machine</th><th>verdict</th><th>likely cause</th><th>fully
verified</th><th>reviews</th></tr></thead><tbody>${rows}</tbody></table>
${intakeTable(notChecked)}
<h2>Deviation trend per machine, energy and technique</h2><p>Each point is one checked beam's dose deviation, (independent − planning
system) / planning system; the lines are the mean and the control limits mean ± 3σ of the beams within tolerance shown (a beam beyond
them does not widen them); circled points lie outside the limits and are listed under their chart.</p>
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

/** One review as a list item: when, who, the decision and the comment. */
function reviewItem(r: ReviewRecord): string {
  const comment = r.comment ? ` — ${esc(r.comment)}` : '';
  return `<li>${esc(r.reviewedAt.replace('T', ' ').slice(0, 16))} — ${esc(r.reviewer)}: <b>${r.accepted ? 'accepted' : 'not accepted'}</b>${comment}</li>`;
}

export function checkPage(record: CheckRecord, result: StoredResult, reviews: readonly ReviewRecord[], who?: Session): string {
  const list = reviews.length ? `<ul id="reviews">${reviews.map(reviewItem).join('')}</ul>` : '<p id="reviews">No review yet.</p>';
  return page(
    // The same words as the stored report's headline.
    `${result.planLabel}: ${planHeadline({ issues: [], verdict: result.verdict, fullyVerified: result.fullyVerified })}`,
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
