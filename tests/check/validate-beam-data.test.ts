/**
 * Beam-data validation that needs the physics: Sp consistent with the PDD and TPR tables at d0, now
 * that Sp may declare the depth it was measured at. Check value: PDD and TPR converted one into the
 * other exactly through Sp agree within 1 % when the three tables are consistent (common practice,
 * no source); the demo machine's tables are consistent by construction.
 */
import { describe, expect, it } from 'vitest';
import { validateBeamData } from '../../src/check/index.js';
import { demoBeamDataWith } from '../helpers/machines.js';

const validateDemoWith = (edit: (m: Record<string, any>) => void) => validateBeamData(demoBeamDataWith(edit));

describe('Sp against PDD and TPR at d0', () => {
  it('the demo machine (Sp measured at its d0) is consistent', () => {
    expect(validateDemoWith(() => {}).filter((i) => i.code === 'tables-disagree')).toEqual([]);
  });
  it('Sp declared as measured at 10 cm when it was measured at d0 makes PDD and TPR disagree: refused, cell by cell', () => {
    const issues = validateDemoWith((m) => {
      m.beams[0].sp.measuredAtDepthCm = 10;
    }).filter((i) => i.code === 'tables-disagree');
    expect(issues.length).toBeGreaterThan(0);
    expect(issues.every((i) => i.severity === 'error' && i.file!.endsWith('6x/pdd.csv'))).toBe(true);
  });
});
