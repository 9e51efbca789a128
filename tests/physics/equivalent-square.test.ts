import { describe, expect, it } from 'vitest';
import { collimatorEquivalentSquareCm, equivalentSquareCm, equivalentSquareOfCircleCm } from '../../src/physics/index.js';

describe('equivalent square', () => {
  // Area-to-perimeter rule 4A/P = 2XY/(X + Y) (Sterling; read in several sources); the sides below are
  // that formula's arithmetic as listed in the project's reference values (section 3.2).
  it.each([
    [10, 20, 13.33],
    [5, 20, 8.0],
    [12, 15, 13.33],
    [5, 10, 6.67],
    [8, 12, 9.6],
    [10, 15, 12.0],
    [12, 20, 15.0],
    [15, 25, 18.75],
  ])('%d x %d cm -> %d cm by 4A/P', (x, y, side) => {
    expect(equivalentSquareCm(x, y)).toBeCloseTo(side, 2);
    expect(equivalentSquareCm(y, x)).toBeCloseTo(side, 2);
  });

  it('a square is its own equivalent square (identity)', () => {
    expect(equivalentSquareCm(7.3, 7.3)).toBeCloseTo(7.3, 12);
  });

  it('a circle of radius r has the equal-area square r·√π, close to the 1.78 r of Bjärngard and Siddon (s/d = 0.891)', () => {
    // Bjärngard & Siddon, Med Phys 9 (1982): s/d = 0.891 for small fields, i.e. s = 1.782 r (read, abstract).
    expect(equivalentSquareOfCircleCm(1)).toBeCloseTo(Math.sqrt(Math.PI), 12);
    expect(Math.abs(equivalentSquareOfCircleCm(5) / (2 * 5 * 0.891) - 1)).toBeLessThan(0.006);
  });

  it('the collimator-exchange form reduces to 4A/P when k = 1 and weights the upper (Y) jaws when k > 1', () => {
    expect(collimatorEquivalentSquareCm(5, 20, 1)).toBeCloseTo(equivalentSquareCm(5, 20), 12);
    expect(collimatorEquivalentSquareCm(5, 20, 1.5)).toBeGreaterThan(collimatorEquivalentSquareCm(20, 5, 1.5));
    expect(collimatorEquivalentSquareCm(10, 10, 1.7)).toBeCloseTo(10, 12);
  });
});
