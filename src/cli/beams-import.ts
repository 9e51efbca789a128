import { z } from 'zod';
import { formatIssue } from '../model/index.js';
import { importScans } from '../run/index.js';
import { writeFileAtomic } from './atomic-write.js';
import type { CommandOutcome } from './outcome.js';
import { refuseOptions } from './refuse.js';

const numbers = (what: string) =>
  z
    .string()
    .regex(/^-?\d+(\.\d+)?(,-?\d+(\.\d+)?)*$/, `${what} must be numbers separated by commas`)
    .transform((s) => s.split(',').map(Number));

export const ImportScansOptions = z.object({
  quantity: z.enum(['pdd', 'tmr', 'oar'], { message: "--quantity must be 'pdd', 'tmr' or 'oar'" }),
  depths: numbers('--depths').optional(),
  positions: numbers('--positions').optional(),
  normalize: z
    .union([
      z.literal('max'),
      z
        .string()
        .regex(/^\d+(\.\d+)?$/)
        .transform(Number),
    ])
    .default('max'),
  columns: numbers('--columns')
    .refine((c) => c.length === 2 && c.every((x) => Number.isInteger(x) && x >= 1), '--columns must be two column numbers, e.g. 1,3')
    .transform((c) => [c[0]!, c[1]!] as const)
    .optional(),
  positionUnit: z.enum(['cm', 'mm']).default('cm'),
  out: z.string().min(1),
});

/** `plumbline beams import-scans FIELD=FILE…` (DEPTH=FILE… for profiles): a PDD, TMR or OAR table from generic two-column scans. */
export function runImportScans(pairs: readonly string[], raw: Record<string, unknown>): CommandOutcome {
  const p = ImportScansOptions.safeParse(raw);
  if (!p.success) return refuseOptions(p.error.issues.map((i) => i.message));
  const o = p.data;
  const profile = o.quantity === 'oar';
  const grid = profile ? o.positions : o.depths;
  if (!grid)
    return refuseOptions([
      profile ? "--positions (the table's off-axis distances, cm) is needed for profiles" : "--depths (the table's depths, cm) is needed",
    ]);
  const scans = pairs.map((s) => /^(\d+(?:\.\d+)?)=(.+)$/.exec(s));
  if (scans.some((m) => !m))
    return refuseOptions([
      profile
        ? 'each profile is DEPTH=FILE, the depth in cm: 10=profile-10cm.txt'
        : 'each scan is FIELD=FILE, the field side in cm: 10=pdd-10x10.txt',
    ]);
  const r = importScans({
    quantity: o.quantity,
    scans: scans.map((m) => ({ atCm: Number(m![1]), file: m![2]! })),
    gridCm: grid,
    normalizeAt: o.normalize,
    ...(o.columns ? { columns: o.columns } : {}),
    positionUnit: o.positionUnit,
  });
  if (!r.ok) return { stdout: [], stderr: r.issues.map(formatIssue), exitCode: 2 };
  writeFileAtomic(o.out, r.value);
  return {
    stdout: [`wrote ${o.out} from ${scans.length} scan(s); check it, then name it in the manifest and run plumbline beams validate`],
    stderr: [],
    exitCode: 0,
  };
}
