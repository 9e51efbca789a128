import type { Issue, LookupNote } from '../model/index.js';

const fmt = (v: number) => v.toFixed(2);

/** Every refused lookup as an issue; a non-finite factor without one is a data problem. */
export function refusals(log: readonly LookupNote[], beamId: string): Issue[] {
  const out: Issue[] = log
    .filter((n) => n.kind === 'out-of-range')
    .map((n) => ({
      severity: 'error' as const,
      code: 'out-of-range' as const,
      message:
        `${n.table}: ${n.axis} ${fmt(n.requested)} ${n.unit} is outside the table (${fmt(n.range[0])} to ${fmt(n.range[1])} ${n.unit}) and no ` +
        `clamp is allowed there`,
      expected: `${n.axis} within ${fmt(n.range[0])} to ${fmt(n.range[1])} ${n.unit}`,
      found: `${fmt(n.requested)} ${n.unit}`,
    }));
  return out.length ? out : [{ severity: 'error', code: 'physical-range', message: `beam ${beamId}: a factor is not a finite number` }];
}
