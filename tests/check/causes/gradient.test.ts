import { describe, expect, it } from 'vitest';
import { normalCdf, PENUMBRA_80_20_MM } from '../../../src/check/causes/gradient.js';

describe('the blurred field edge', () => {
  it('the standard normal distribution function matches the printed table (Φ(0) 0.5, Φ(1) 0.8413, Φ(1.96) 0.9750, Φ(−1.645) 0.0500)', () => {
    // Values of the standard normal table found in any statistics handbook (common practice, no source).
    expect(normalCdf(0)).toBeCloseTo(0.5, 7);
    expect(normalCdf(1)).toBeCloseTo(0.8413, 4);
    expect(normalCdf(1.96)).toBeCloseTo(0.975, 4);
    expect(normalCdf(-1.645)).toBeCloseTo(0.05, 4);
  });
  it('the edge blurred by the assumed penumbra rises from 20 % to 80 % over that penumbra', () => {
    const sigma = PENUMBRA_80_20_MM / (2 * 0.8416);
    expect(normalCdf(PENUMBRA_80_20_MM / 2 / sigma)).toBeCloseTo(0.8, 4);
    expect(normalCdf(-PENUMBRA_80_20_MM / 2 / sigma)).toBeCloseTo(0.2, 4);
  });
});
