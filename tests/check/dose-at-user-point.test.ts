import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { checkPlan, DEFAULT_POLICY } from '../../src/check/index.js';
import type { DoseGrid } from '../../src/model/index.js';
import { beams, check, importOrThrow } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const brain = importOrThrow(fileURLToPath(new URL('../../fixtures/demo/clinic/brain-laterals.dcm', import.meta.url)));
const away: [number, number, number] = [55, 0, 120];

/** A per-beam grid of one uniform dose over a box around the point (trilinear interpolation of a constant is that constant). */
function uniformBeamGrid(beamNumber: number, doseGy: number): DoseGrid {
  return {
    file: `beam-${beamNumber}.dcm`,
    frameOfReferenceUid: brain.frameOfReferenceUid!,
    referencedPlanUid: brain.sopInstanceUid,
    referencedBeamNumber: beamNumber,
    summationType: 'BEAM',
    units: 'GY',
    type: 'PHYSICAL',
    columns: 2,
    rows: 2,
    originMm: [0, -50, 100],
    rowDirection: [1, 0, 0],
    columnDirection: [0, 1, 0],
    normal: [0, 0, 1],
    columnSpacingMm: 100,
    rowSpacingMm: 100,
    frameOffsetsMm: [0, 50],
    doseGy: new Float32Array(8).fill(doseGy),
  };
}

describe('a point of the user away from where the Beam Dose applies', () => {
  it('is never compared with the Beam Dose of another point: our dose alone, no deviation, "not verified"', () => {
    const r = check(brain, demo, { point: away });
    for (const b of beams(r)) {
      if (b.status !== 'checked') throw new Error('not checked');
      expect(b.calculation.independentDoseCGy).toBeGreaterThan(0);
      expect(b.planningSystemDoseCGy).toBeUndefined();
      expect(b.calculation.doseDeviationPercent).toBeUndefined();
      expect(b.verdict).toBe('not verified');
      expect(b.verdictReasons.map((n) => n.code)).toEqual(['no-dose-at-point']);
    }
    expect(r.verdict).toBe('not verified');
    expect(r.fractionGroups[0]!.totals).toEqual([]);
  });

  it("is compared with the planning system's per-beam dose grid there when one is given", () => {
    const alone = beams(check(brain, demo, { point: away }));
    const ours = alone.map((b) => (b.status === 'checked' ? b.calculation.independentDoseCGy : Number.NaN));
    // Grids 1 % above our doses: the deviation is −1/1.01 = −0.990 %, within tolerance.
    const grids = ours.map((cGy, i) => uniformBeamGrid(i + 1, (cGy * 1.01) / 100));
    const r = checkPlan(
      brain,
      { path: 'test.dcm', sha256: '0' },
      { machine: demo, policy: DEFAULT_POLICY, aliases: new Map(), pointPatientMm: away, suggestPoint: false, doseGrids: grids },
    );
    for (const b of beams(r)) {
      if (b.status !== 'checked') throw new Error('not checked');
      expect(b.planningSystemDoseFrom).toBe('dose grid');
      expect(b.calculation.doseDeviationPercent).toBeCloseTo(-100 * (0.01 / 1.01), 3);
      expect(b.verdictReasons.map((n) => n.code)).toContain('compared-with-dose-grid');
    }
    expect(r.verdict).toBe('within tolerance');
  });
});

describe('an RT Dose of another plan', () => {
  it('is said plainly, not ignored without a word', () => {
    const other = { ...uniformBeamGrid(1, 1), referencedPlanUid: '1.2.3.4', frameOfReferenceUid: '1.2.3.5' };
    const r = checkPlan(
      brain,
      { path: 'test.dcm', sha256: '0' },
      { machine: demo, policy: DEFAULT_POLICY, aliases: new Map(), suggestPoint: false, doseGrids: [other] },
    );
    expect(r.warnings).toContainEqual({ code: 'dose-not-this-plan', values: { files: 'beam-1.dcm' } });
  });
});
