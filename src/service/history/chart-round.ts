import { topCauseText } from '../../report/explanation-text.js';
import type { CheckRecord, ReviewRecord, StoredResult } from './store.js';

/** One check as the chart-round list shows it: the check, its worst beam, the likely cause, its reviews. */
export interface ChartRoundEntry {
  readonly check: CheckRecord;
  readonly worst?: { readonly beamNumber?: number; readonly deviationPercent: number };
  readonly topCause?: string;
  readonly reviews: readonly ReviewRecord[];
}

const beamsOf = (r: StoredResult | undefined) => r?.fractionGroups.flatMap((g) => g.beams) ?? [];

/** The checked beam whose deviation is largest in size. */
export function worstBeam(r: StoredResult | undefined): ChartRoundEntry['worst'] {
  let worst: ChartRoundEntry['worst'];
  for (const b of beamsOf(r)) {
    const d = b.calculation?.doseDeviationPercent;
    if (b.status !== 'checked' || d === undefined || (worst && Math.abs(d) <= Math.abs(worst.deviationPercent))) continue;
    worst = { ...(b.beamNumber !== undefined ? { beamNumber: b.beamNumber } : {}), deviationPercent: d };
  }
  return worst;
}

/** The largest explained cause over the check's beams, in a few words ("beam 2: MU as typed? +11.2 %"). */
export function topCause(r: StoredResult | undefined): string | undefined {
  let best: { beam?: number; code: string; value: number } | undefined;
  for (const b of beamsOf(r))
    for (const c of b.explanation?.causes ?? [])
      if (!best || Math.abs(c.contributionPercent) > Math.abs(best.value))
        best = { ...(b.beamNumber !== undefined ? { beam: b.beamNumber } : {}), code: c.code, value: c.contributionPercent };
  return best ? topCauseText(best.beam, best.code, best.value) : undefined;
}

export function chartRoundEntry(check: CheckRecord, result: StoredResult | undefined, reviews: readonly ReviewRecord[]): ChartRoundEntry {
  const worst = worstBeam(result);
  const cause = topCause(result);
  return { check, ...(worst ? { worst } : {}), ...(cause ? { topCause: cause } : {}), reviews };
}

/** The techniques the trend keeps apart (their deviations differ in kind). */
export type Technique = 'open' | 'wedged' | 'MLC' | 'modulated' | 'electron';

/** A stored beam's technique, from what its result says: electron, modulated, wedged, shaped by leaves, or open. */
export function techniqueOf(b: StoredResult['fractionGroups'][number]['beams'][number]): Technique {
  if (b.radiationType === 'ELECTRON') return 'electron';
  const c = b.calculation;
  if (c?.modulated) return 'modulated';
  if (c?.wedgeId) return 'wedged';
  // The leaf-end note is written for every beam whose field the leaves shape.
  if (c?.approximations?.some((n) => n.code === 'leaf-end-gap' || n.code === 'leaf-ends-not-modelled')) return 'MLC';
  return 'open';
}
