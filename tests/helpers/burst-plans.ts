import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { coordinatesDoseReference, planDataset, staticBeam } from '../../scripts/fixtures/plan-parts.js';
import { RT_PLAN_STORAGE, writeDataset } from '../../scripts/lib/dcmjs-writer.js';

/** n distinct single-field plans (their own SOP instance each), labelled "<prefix> <i>", written as a planning system exports them. */
export function burstPlans(dir: string, prefix: string, n: number): string[] {
  mkdirSync(dir, { recursive: true });
  const iso: [number, number, number] = [0, 0, 0];
  return Array.from({ length: n }, (_, i) => {
    const file = join(dir, `${prefix}-${i}.dcm`);
    writeDataset(
      file,
      planDataset({
        file: `${prefix}-${i}.dcm`,
        patientId: `${prefix}-${i}`,
        patientName: 'Load^Test',
        label: `${prefix} ${i}`,
        name: 'load',
        description: 'test',
        doseReferences: [coordinatesDoseReference(1, 'isocenter', iso, 2)],
        fractionGroups: [{ number: 1, fractions: 1, prescriptionGy: 2, beams: [{ number: 1, mu: 200, doseGy: 2, specPoint: iso }] }],
        beams: [staticBeam(1, 'AP', 6, 0, 900, iso)],
      }),
      RT_PLAN_STORAGE,
    );
    return file;
  });
}
