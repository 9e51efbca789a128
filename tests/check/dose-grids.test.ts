import { describe, expect, it } from 'vitest';
import { attachDoseGrids } from '../../src/check/dose-grids.js';
import type { DoseGrid } from '../../src/model/index.js';
import { beams, check, importOrThrow } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine, manifestPath } from '../helpers/machines.js';

const brain = check(importOrThrow(manifestPath('fixtures/demo/clinic/brain-laterals.dcm')), machine(DEMO_MANIFEST));
const at = brain.fractionGroups[0]!.totals[0]!.pointPatientMm;

/** A 2 × 2 × 2 grid of one dose around the plan's point. */
const grid = (summationType: DoseGrid['summationType'], gy: number, referencedBeamNumber?: number): DoseGrid => ({
  file: 'd.dcm',
  frameOfReferenceUid: '2.25.1',
  summationType,
  ...(referencedBeamNumber !== undefined ? { referencedBeamNumber } : {}),
  units: 'GY',
  type: 'PHYSICAL',
  columns: 2,
  rows: 2,
  originMm: [at[0] - 10, at[1] - 10, at[2] - 10],
  rowDirection: [1, 0, 0],
  columnDirection: [0, 1, 0],
  normal: [0, 0, 1],
  columnSpacingMm: 20,
  rowSpacingMm: 20,
  frameOffsetsMm: [0, 20],
  doseGy: new Float32Array(8).fill(gy),
});

describe("the planning system's dose grids beside our doses", () => {
  it('a per-beam grid goes to its beam, a per-fraction grid to the totals (in cGy, with its summation)', () => {
    const [g] = attachDoseGrids(brain.fractionGroups, [grid('BEAM', 0.95, 2), grid('FRACTION', 1.9)]);
    // The grid holds 32-bit floats: 0.95 Gy reads back as 0.9499999881 Gy.
    const [first, second] = beams({ fractionGroups: [g!] }).map((b) => b.doseGridCGy);
    expect(first).toBeUndefined();
    expect(second).toBeCloseTo(95, 5);
    expect(g!.totals[0]!.doseGridCGy).toBeCloseTo(190, 4);
    expect(g!.totals[0]!.doseGridSummation).toBe('FRACTION');
  });
  it('without grids the groups are as they were', () => {
    expect(attachDoseGrids(brain.fractionGroups, [])).toEqual(brain.fractionGroups);
  });
});
