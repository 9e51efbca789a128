import { describe, expect, it } from 'vitest';
import { mayneordFactor } from '../../src/physics/mayneord.js';

describe('the Mayneord F factor', () => {
  it('carries a PDD from 80 to 100 cm SSD at 10 cm depth (dmax 0.5 cm): ((100.5/80.5)·(90/110))² = 1.0434', () => {
    // F = ((f2 + dm)/(f1 + dm))² · ((f1 + d)/(f2 + d))² (the textbook form, from memory); the arithmetic by hand:
    // (100.5/80.5)² = 1.558659, (90/110)² = 0.669421, product 1.043400.
    expect(mayneordFactor(80, 100, 10, 0.5)).toBeCloseTo(1.0434, 4);
  });
  it('is 1 at the same SSD and at dmax, and below 1 toward a shorter SSD', () => {
    expect(mayneordFactor(100, 100, 10, 1.5)).toBe(1);
    expect(mayneordFactor(80, 120, 1.5, 1.5)).toBeCloseTo(1, 12);
    expect(mayneordFactor(100, 80, 10, 1.5)).toBeLessThan(1);
  });
});
