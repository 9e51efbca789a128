import type { CheckDocument } from './check-json.js';

/**
 * What the beam data are, in one sentence every report carries: name, version, hash, that they
 * passed validation (nothing else is ever used), and who approved them when, or that no one is named.
 */
export function beamDataText(b: CheckDocument['beamData']): string {
  const validation = `validated${b.validationWarnings ? ` with ${b.validationWarnings} warning(s)` : ', no warnings'}`;
  const approval = b.approvedOn
    ? `approved ${b.approvedOn} by ${b.approvedBy}${b.commissionedOn ? ` (commissioned ${b.commissionedOn})` : ''}`
    : 'approval not recorded in the beam data';
  return (
    `beam data ${b.machine}, version ${b.dataVersion}${b.invented ? ' (INVENTED DEMO DATA, never for a patient)' : ''}, ` +
    `SHA-256 ${b.sha256.slice(0, 16)}…; ${validation}; ${approval}`
  );
}
