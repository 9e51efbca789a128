import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { RT_PLAN_STORAGE, writeDataset } from '../../scripts/lib/dcmjs-writer.js';
import { DEMO_PLAN_SPECS } from '../../scripts/fixtures/demo-plans.js';
import { type Dataset, planDataset } from '../../scripts/fixtures/plan-parts.js';

const work = mkdtempSync(join(tmpdir(), 'plumbline-variants-'));
let n = 0;

/** Writes a demo plan changed by `mutate` (on the dcmjs dataset before encoding) and returns its path. */
export function writeVariant(planFile: string, mutate: (ds: any) => void): string {
  const spec = DEMO_PLAN_SPECS.find((p) => p.file === planFile);
  if (!spec) throw new Error(`no demo plan ${planFile}`);
  // A copy: the specification's items are shared between calls, and one mutant must not leak into the next.
  const ds: Dataset = structuredClone(planDataset(spec));
  mutate(ds);
  const out = join(work, `${n++}-${planFile}`);
  writeDataset(out, ds, RT_PLAN_STORAGE);
  return out;
}
