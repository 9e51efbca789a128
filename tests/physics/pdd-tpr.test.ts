import { describe, expect, it } from 'vitest';
import { pddFromTpr, tpr2010FromPddRatio, tprFromPdd } from '../../src/physics/index.js';

describe('PDD <-> TPR conversion', () => {
  it('TPR is 1 at the normalization depth (identity: PDD = 100 % at d0, same field)', () => {
    expect(tprFromPdd(100, 1.5, 100, 1.5, 1.01, 1.01)).toBe(1);
  });
  it('round-trips exactly: PDD -> TPR -> PDD and TPR -> PDD -> TPR', () => {
    for (const [pdd, d, f, d0, a, b] of [
      [67.5, 10, 100, 1.5, 1.001, 1.012],
      [39.3, 20, 90, 10, 1, 1.03],
      [85.2, 5, 120, 2.5, 0.99, 1.0],
    ] as const) {
      const tpr = tprFromPdd(pdd, d, f, d0, a, b);
      expect(pddFromTpr(tpr, d, f, d0, a, b)).toBeCloseTo(pdd, 12);
      expect(tprFromPdd(pddFromTpr(tpr, d, f, d0, a, b), d, f, d0, a, b)).toBeCloseTo(tpr, 14);
    }
  });
  it('follows TPR = PDD/100 · ((f + d)/(f + d0))² · Sp(rd0)/Sp(rd) (formula read, secondary)', () => {
    expect(tprFromPdd(67.5, 10, 100, 1.5, 1.0, 1.02)).toBeCloseTo((0.675 * (110 / 101.5) ** 2) / 1.02, 12);
  });
});

describe('beam quality TPR20,10 from PDD20,10 (IAEA TRS-398 relation)', () => {
  // PDD(10) and PDD(20) for 10 x 10 at SSD 100 from BJR Supplement 25 (read, secondary copy);
  // TPR20,10 = 1.2661·PDD20/PDD10 − 0.0595 gives these (derived in the project's reference values).
  it.each([
    [4, 63.0, 34.1, 0.626],
    [5, 65.0, 36.2, 0.646],
    [6, 67.5, 39.3, 0.678],
    [8, 71.0, 43.4, 0.714],
  ])('%d MV: PDD10 %d %, PDD20 %d % -> TPR20,10 %d', (_mv, p10, p20, tpr) => {
    expect(tpr2010FromPddRatio(p20, p10)).toBeCloseTo(tpr, 3);
  });
});
