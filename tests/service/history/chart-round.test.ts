import { describe, expect, it } from 'vitest';
import { topCause, worstBeam } from '../../../src/service/history/chart-round.js';
import type { StoredResult } from '../../../src/service/history/store.js';

const result = (beams: StoredResult['fractionGroups'][number]['beams']): StoredResult => ({
  planLabel: 'P',
  verdict: 'needs review',
  fullyVerified: true,
  fractionGroups: [{ beams }],
});

describe('a check on the chart-round list', () => {
  it('its worst beam is the checked beam with the largest deviation in size, whatever its sign', () => {
    const r = result([
      { status: 'checked', beamNumber: 1, radiationType: 'PHOTON', calculation: { doseDeviationPercent: 1.5 } },
      { status: 'checked', beamNumber: 2, radiationType: 'PHOTON', calculation: { doseDeviationPercent: -3.1 } },
      { status: 'not checked', beamNumber: 3, radiationType: 'PHOTON' },
    ]);
    expect(worstBeam(r)).toEqual({ beamNumber: 2, deviationPercent: -3.1 });
    expect(worstBeam(undefined)).toBeUndefined();
  });
  it('its likely cause is the largest explained cause over its beams', () => {
    const r = result([
      { status: 'checked', beamNumber: 1, radiationType: 'PHOTON', explanation: { causes: [{ code: 'depth', contributionPercent: 1.2 }] } },
      { status: 'checked', beamNumber: 2, radiationType: 'PHOTON', explanation: { causes: [{ code: 'mu-as-typed', contributionPercent: 11.2 }] } },
    ]);
    expect(topCause(r)).toBe('beam 2: MU as typed? +11.2 %');
    expect(topCause(result([]))).toBeUndefined();
  });
});
