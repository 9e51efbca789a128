import { describe, expect, it } from 'vitest';
import { narrowMuPercent } from '../../../src/check/causes/modulation.js';
import type { CheckedBeam } from '../../../src/model/index.js';

/** A modulated beam's result with only the segment rows it is judged on. */
const withRows = (rows: { muShare: number; openWidthCm?: number }[]) =>
  ({ calculation: { modulated: { segmentRows: rows } } }) as unknown as CheckedBeam;

describe('the share of MU through narrow openings at the point', () => {
  it('counts open segments under 2 cm by their MU share; covered segments (width 0) are not narrow openings', () => {
    const b = withRows([
      { muShare: 0.2, openWidthCm: 1.5 },
      { muShare: 0.3, openWidthCm: 0 },
      { muShare: 0.1, openWidthCm: 1.99 },
      { muShare: 0.4, openWidthCm: 2 },
    ]);
    expect(narrowMuPercent(b)).toBeCloseTo(30, 10);
  });
  it('says nothing for a result written before widths were kept', () => {
    expect(narrowMuPercent(withRows([{ muShare: 1 }]))).toBeUndefined();
  });
});
