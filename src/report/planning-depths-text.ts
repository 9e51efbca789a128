import type { BeamCheck } from '../model/index.js';
import { signed } from './table.js';

type Theirs = NonNullable<NonNullable<BeamCheck['calculation']>['planningSystemDepths']>;

/** "the planning system's depth 98.0 mm (ours +2.0 mm), …": its own depth data beside ours, one line for the terminal and the HTML report. */
export function planningDepthsText(t: Theirs): string {
  const part = (what: string, theirs: number | undefined, diff: number | undefined) =>
    theirs === undefined ? [] : [`${what} ${theirs.toFixed(1)} mm${diff === undefined ? '' : ` (ours ${signed(diff)} mm)`}`];
  const parts = [...part('depth', t.depthMm, t.depthDifferenceMm), ...part('equivalent depth', t.equivalentDepthMm, t.equivalentDepthDifferenceMm), ...part('SSD', t.ssdMm, t.ssdDifferenceMm)];
  return `the planning system's own ${parts.join(', ')}`;
}
