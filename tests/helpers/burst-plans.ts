import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { writeSingleFieldPlan } from '../../scripts/fixtures/single-field-plan.js';

/** n distinct single-field plans (their own SOP instance each), labelled "<prefix> <i>", written as a planning system exports them. */
export function burstPlans(dir: string, prefix: string, n: number): string[] {
  mkdirSync(dir, { recursive: true });
  return Array.from({ length: n }, (_, i) => {
    const file = join(dir, `${prefix}-${i}.dcm`);
    writeSingleFieldPlan(file, { id: `${prefix}-${i}`, label: `${prefix} ${i}`, patientName: 'Load^Test' });
    return file;
  });
}
