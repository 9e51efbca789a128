import type { Calculation } from '../model/index.js';
import { signed } from './table.js';

type Theirs = NonNullable<Calculation['planningSystemDepths']>;

/** "the planning system's own depth 98.0 mm (ours +2.0 mm), …": its own depth data beside ours, after a lead-in. */
export function planningDepthsText(t: Theirs, lead = "the planning system's own"): string {
  const part = (what: string, theirs: number | undefined, diff: number | undefined) =>
    theirs === undefined ? [] : [`${what} ${theirs.toFixed(1)} mm${diff === undefined ? '' : ` (ours ${signed(diff)} mm)`}`];
  const parts = [
    ...part('depth', t.depthMm, t.depthDifferenceMm),
    ...part('equivalent depth', t.equivalentDepthMm, t.equivalentDepthDifferenceMm),
    ...part('SSD', t.ssdMm, t.ssdDifferenceMm),
  ];
  return `${lead} ${parts.join(', ')}`;
}
