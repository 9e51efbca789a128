import { describe, expect, it } from 'vitest';
import { machineAliasCause } from '../../../src/check/causes/setup.js';

describe('a machine matched through an alias', () => {
  it('is named without a share when the plan names another machine than the beam data', () => {
    const c = machineAliasCause('--machine-alias LINAC_B=NG_LINAC1', 'LINAC_B', 'NG_LINAC1')!;
    expect(c).toMatchObject({ code: 'machine-alias', contributionPercent: 0, estimated: false, confidence: 'possible' });
    expect(c.evidence).toMatchObject({ planMachine: 'LINAC_B', beamData: 'NG_LINAC1' });
  });
  it('is not named for the same name, or when the match is not known', () => {
    expect(machineAliasCause('same name', 'NG_LINAC1', 'NG_LINAC1')).toBeUndefined();
    expect(machineAliasCause(undefined, undefined, 'NG_LINAC1')).toBeUndefined();
  });
});
