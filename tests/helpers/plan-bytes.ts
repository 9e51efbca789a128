/**
 * A one-beam test plan as dcmjs writes it, changed on its data set before encoding, then imported:
 * for the RT Plan reader's unit tests. Invented values.
 */
import { datasetBytes, RT_PLAN_STORAGE } from '../../scripts/lib/dcmjs-writer.js';
import { type BeamSpec, coordinatesDoseReference, planDataset, staticBeam } from '../../scripts/fixtures/plan-parts.js';
import { type ImportedPlan, importPlanBytes } from '../../src/dicom/index.js';
import type { Issue, Result } from '../../src/model/index.js';

export const POINT: [number, number, number] = [0, 0, 0];

/** Imports the plan of `beams` (6 MV, 100 MU per beam by default) after `mutate` changed its dcmjs data set. */
export function importChanged(
  mutate: (ds: any) => void = () => {},
  beams: readonly BeamSpec[] = [staticBeam(1, 'AP', 6, 0, 900, POINT)],
): Result<ImportedPlan> {
  const ds = structuredClone(
    planDataset({
      file: 'unit.dcm',
      patientId: 'UNIT-1',
      patientName: 'Unit^Test',
      label: 'UNIT',
      name: 'unit',
      description: 'unit test',
      doseReferences: [coordinatesDoseReference(1, 'point', POINT, 2)],
      fractionGroups: [
        {
          number: 1,
          fractions: 5,
          prescriptionGy: 2,
          beams: beams.map((b) => ({ number: b.number, mu: 100, doseGy: 2 / beams.length, specPoint: POINT })),
        },
      ],
      beams,
    }),
  );
  mutate(ds);
  return importPlanBytes(datasetBytes(ds, RT_PLAN_STORAGE), 'unit.dcm');
}

export function imported(mutate?: (ds: any) => void, beams?: readonly BeamSpec[]): ImportedPlan {
  const r = importChanged(mutate, beams);
  if (!r.ok) throw new Error(r.issues.map((i) => `${i.path}: ${i.message}`).join('; '));
  return r.value;
}

export function refused(mutate: (ds: any) => void, beams?: readonly BeamSpec[]): readonly Issue[] {
  const r = importChanged(mutate, beams);
  if (r.ok) throw new Error('the plan was accepted');
  return r.issues;
}
