/**
 * Writes the demo RT Plans into fixtures/demo/plans/ with dcmjs. Run with `npm run fixtures`; the output is
 * deterministic, so a regenerated fixture differs only where the specifications changed. All values
 * are invented for the demo scenario (see fixtures/demo/plans/README.md).
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { RT_PLAN_STORAGE, writeDataset } from './lib/dcmjs-writer.js';
import { DEMO_PLAN_SPECS } from './fixtures/demo-plans.js';
import { planDataset } from './fixtures/plan-parts.js';

const OUT = fileURLToPath(new URL('../fixtures/demo/plans/', import.meta.url));

for (const p of DEMO_PLAN_SPECS) {
  writeDataset(join(OUT, p.file), planDataset(p), RT_PLAN_STORAGE);
  console.log(`wrote fixtures/demo/plans/${p.file}`);
}
