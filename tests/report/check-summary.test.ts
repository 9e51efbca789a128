import { describe, expect, it } from 'vitest';
import type { PlanCheck } from '../../src/model/index.js';
import { checkSummary } from '../../src/report/check-summary.js';
import { check, importOrThrow } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine, manifestPath } from '../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const brain = check(importOrThrow(manifestPath('fixtures/demo/clinic/brain-laterals.dcm')), demo);
const breast = check(importOrThrow(manifestPath('fixtures/demo/clinic/breast-tangents.dcm')), demo);

describe('the summary of a batch', () => {
  it('counts plans, beams checked and not, and the verdicts of the plans not refused', () => {
    const refusedPlan: PlanCheck = { ...brain, issues: [{ severity: 'error', code: 'missing-table', message: 'x' }] };
    const s = checkSummary([brain, breast, refusedPlan], [{ severity: 'error', code: 'not-dicom', file: 'a.txt', message: 'no' }]);
    expect(s).toEqual({
      plans: 3,
      beamsChecked: 6,
      beamsNotChecked: 0,
      filesRefused: 2,
      verdicts: { 'within tolerance': 1, 'needs review': 0, 'not verified': 0, 'beyond action level': 1 },
    });
  });
});
