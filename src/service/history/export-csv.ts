import type { ChartRoundEntry } from './chart-round.js';

const HEADER = [
  'check',
  'recorded_utc',
  'patient_id',
  'plan',
  'machine',
  'verdict',
  'fully_verified',
  'worst_beam',
  'worst_deviation_percent',
  'likely_cause',
  'reviews',
  'last_reviewer',
  'last_reviewed_utc',
  'last_review_accepted',
];

/**
 * A text field as CSV (RFC 4180: quoted when it holds a comma, quote or line break, quotes doubled).
 * Text from a plan that a spreadsheet would take for a formula (=, +, -, @, a tab or a carriage
 * return first) is led by an apostrophe: shown, never evaluated.
 */
export function csvText(value: string): string {
  const safe = /^[=+\-@\t\r]/.test(value) ? `'${value}` : value;
  return /[",\r\n]/.test(safe) ? `"${safe.replace(/"/g, '""')}"` : safe;
}

/** The chart-round list as CSV, one row per check, numbers as numbers; lines end in CRLF as RFC 4180 has it. */
export function chartRoundCsv(entries: readonly ChartRoundEntry[]): string {
  const rows = entries.map((e) => {
    const last = e.reviews.at(-1);
    return [
      String(e.check.id),
      e.check.recordedAt,
      csvText(e.check.patientId ?? ''),
      csvText(e.check.planLabel),
      csvText(e.check.machine ?? ''),
      e.check.verdict,
      e.check.fullyVerified ? 'yes' : 'no',
      e.worst?.beamNumber !== undefined ? String(e.worst.beamNumber) : '',
      e.worst ? e.worst.deviationPercent.toFixed(2) : '',
      csvText(e.topCause ?? ''),
      String(e.reviews.length),
      csvText(last?.reviewer ?? ''),
      last?.reviewedAt ?? '',
      last ? (last.accepted ? 'yes' : 'no') : '',
    ].join(',');
  });
  return [HEADER.join(','), ...rows].map((l) => `${l}\r\n`).join('');
}
