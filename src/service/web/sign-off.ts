import { escapeHtml as esc } from '../../report/html-escape.js';
import type { ReviewRecord } from '../history/store.js';

/**
 * The stored report with its sign-off: once a check is reviewed, a block at the end of the report
 * (so also on its printed pages) says who checked it, in what role, when, and their decision.
 */
export function withSignOff(html: string, reviews: readonly ReviewRecord[]): string {
  if (!reviews.length) return html;
  const rows = reviews
    .map(
      (r) =>
        `<tr><td>${esc(r.reviewer)}</td><td>${esc(r.reviewerRole ?? '—')}</td><td>${esc(r.reviewedAt.slice(0, 16).replace('T', ' '))}</td>` +
        `<td>${r.accepted ? 'accepted' : 'not accepted'}</td><td>${esc(r.comment)}</td></tr>`,
    )
    .join('');
  const block =
    `<section class="sign-off" id="sign-off" style="break-inside: avoid-page"><h2>Sign-off</h2><table><thead><tr><th>checked by</th>` +
    `<th>role</th><th>date (UTC)</th><th>decision</th><th>comment</th></tr></thead><tbody>${rows}</tbody></table></section>`;
  const end = html.lastIndexOf('</body>');
  return end < 0 ? html + block : `${html.slice(0, end)}${block}\n${html.slice(end)}`;
}
