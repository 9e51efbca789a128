import type { CheckedBeam, DeviationCause } from '../../model/index.js';

/** A typing slip is recognised when the MU ratio matches it within this (relative). */
const SLIP_MATCH = 0.002;

/**
 * What is left beyond the tolerance, when the plan's other beams agree: the beam's MU as typed?
 * Named as a slip (×10, two digits swapped, a 1 for a 7) when the planned MU matches one.
 */
export function muCause(b: CheckedBeam, leftPercent: number, others: readonly CheckedBeam[]): DeviationCause | undefined {
  if (!others.length || Math.abs(leftPercent) <= b.tolerancePercent || b.plannedMu === undefined) return undefined;
  const othersMean = others.reduce((s, o) => s + o.calculation.doseDeviationPercent!, 0) / others.length;
  const ratio = (1 + leftPercent / 100) / (1 + othersMean / 100);
  const intendedMu = b.plannedMu / ratio;
  const slip = typingSlip(b.plannedMu, ratio);
  return {
    code: 'mu-as-typed',
    contributionPercent: 100 * (ratio - 1),
    confidence: slip ? 'estimated' : 'possible',
    evidence: { plannedMu: b.plannedMu, muAtTheOtherBeamsAgreement: intendedMu, othersMeanDeviationPercent: othersMean, ...(slip ? { slip } : {}) },
  };
}

/** A typing slip that turns some intended MU into the planned one with this ratio, if any. */
export function typingSlip(plannedMu: number, ratio: number): string | undefined {
  const near = (intended: number) => intended > 0 && Math.abs(plannedMu / intended / ratio - 1) < SLIP_MATCH;
  if (near(plannedMu / 10)) return 'a digit too many (×10)';
  if (near(plannedMu * 10)) return 'a digit too few (÷10)';
  const text = plannedMu.toFixed(1);
  for (let i = 0; i + 1 < text.length; i++) {
    if (text[i] === '.' || text[i + 1] === '.') continue;
    const swapped = `${text.slice(0, i)}${text[i + 1]}${text[i]}${text.slice(i + 2)}`;
    if (swapped !== text && near(Number(swapped))) return `two digits swapped (${swapped} typed as ${text})`;
  }
  for (const [from, to] of [
    ['7', '1'],
    ['1', '7'],
  ] as const) {
    for (let i = 0; i < text.length; i++) {
      if (text[i] !== from) continue;
      const other = `${text.slice(0, i)}${to}${text.slice(i + 1)}`;
      if (near(Number(other))) return `a ${from} typed for a ${to} (${other} typed as ${text})`;
    }
  }
  return undefined;
}
