/**
 * Without the CT, what the planning system's RT Dose says of its heterogeneity correction (Tissue
 * Heterogeneity Correction, 3004,0014: IMAGE, ROI_OVERRIDE or WATER, as the DICOM standard defines
 * it) sets the case: a corrected planning-system dose against our homogeneous one is a heterogeneous
 * case, judged with its levels; a plan with neither the CT nor a stating RT Dose says the category
 * could not be told (common practice, no source).
 */
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { checkPlan, DEFAULT_POLICY } from '../../src/check/index.js';
import type { DoseGrid, PlanCheck } from '../../src/model/index.js';
import { beams, importOrThrow } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const brain = importOrThrow(fileURLToPath(new URL('../../fixtures/demo/clinic/brain-laterals.dcm', import.meta.url)));

/** A plan-summed grid of the brain plan, stating a correction or none. */
function planGrid(correction?: string[]): DoseGrid {
  return {
    file: 'plan-dose.dcm',
    frameOfReferenceUid: brain.frameOfReferenceUid!,
    referencedPlanUid: brain.sopInstanceUid,
    summationType: 'PLAN',
    units: 'GY',
    type: 'PHYSICAL',
    ...(correction ? { tissueHeterogeneityCorrection: correction } : {}),
    columns: 2,
    rows: 2,
    originMm: [-100, -100, -100],
    rowDirection: [1, 0, 0],
    columnDirection: [0, 1, 0],
    normal: [0, 0, 1],
    columnSpacingMm: 200,
    rowSpacingMm: 200,
    frameOffsetsMm: [0, 200],
    doseGy: new Float32Array(8).fill(60),
  };
}
const run = (grids?: DoseGrid[]): PlanCheck =>
  checkPlan(
    brain,
    { path: 'brain.dcm', sha256: '0' },
    { machine: demo, policy: DEFAULT_POLICY, aliases: new Map(), suggestPoint: false, ...(grids ? { doseGrids: grids } : {}) },
  );
const categories = (r: PlanCheck) => beams(r).map((b) => (b.status === 'checked' ? b.category : 'not checked'));

describe("the planning system's heterogeneity correction, without the CT", () => {
  it('IMAGE: the beams are a heterogeneous case, with its levels, and the plan says our dose is homogeneous', () => {
    const r = run([planGrid(['IMAGE'])]);
    expect(categories(r)).toEqual(['heterogeneous', 'heterogeneous']);
    expect(r.warnings).toContainEqual({ code: 'planning-system-heterogeneity-corrected', values: { correction: 'IMAGE' } });
    const b = beams(r)[0]!;
    expect(b.status === 'checked' && b.actionPercent).toBe(DEFAULT_POLICY.levels.heterogeneous!.actionPercent);
  });
  it('ROI_OVERRIDE is a correction too; WATER is none: the beams keep their own category and nothing is said', () => {
    expect(categories(run([planGrid(['ROI_OVERRIDE'])]))).toEqual(['heterogeneous', 'heterogeneous']);
    const water = run([planGrid(['WATER'])]);
    expect(categories(water)).toEqual(['on-axis-open', 'on-axis-open']);
    expect(water.warnings.map((w) => w.code)).not.toContain('heterogeneity-unknown');
  });
  it('with neither the CT nor a stating RT Dose, the plan says the category could not be told', () => {
    expect(run().warnings.map((w) => w.code)).toContain('heterogeneity-unknown');
    expect(run([planGrid()]).warnings.map((w) => w.code)).toContain('heterogeneity-unknown');
  });
});
