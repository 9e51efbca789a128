import { inverseSquareFactor } from './inverse-square.js';

/**
 * TPR from PDD at the same depth (AAPM TG-71; Khan):
 *   TPR(d, rd) = PDD(d, r, f)/100 · ((f + d)/(f + d0))² · Sp(rd0)/Sp(rd)
 * with the PDD normalized to 100 % at d0, f the SSD, r the field at the surface,
 * rd = r·(f + d)/f and rd0 = r·(f + d0)/f.
 */
export function tprFromPdd(pddPercent: number, depthCm: number, ssdCm: number, d0Cm: number, spAtRd0: number, spAtRd: number): number {
  return (pddPercent / 100) * inverseSquareFactor(ssdCm + depthCm, ssdCm + d0Cm) * (spAtRd0 / spAtRd);
}

/** The inverse of tprFromPdd: PDD(d, r, f) = 100·TPR(d, rd) · ((f + d0)/(f + d))² · Sp(rd)/Sp(rd0). */
export function pddFromTpr(tpr: number, depthCm: number, ssdCm: number, d0Cm: number, spAtRd0: number, spAtRd: number): number {
  return 100 * tpr * inverseSquareFactor(ssdCm + d0Cm, ssdCm + depthCm) * (spAtRd / spAtRd0);
}

/**
 * Beam quality TPR20,10 from the ratio PDD20/PDD10 for a 10 × 10 field at SSD 100 cm:
 * TPR20,10 = 1.2661·PDD20,10 − 0.0595 (IAEA TRS-398).
 */
export function tpr2010FromPddRatio(pdd20Percent: number, pdd10Percent: number): number {
  return 1.2661 * (pdd20Percent / pdd10Percent) - 0.0595;
}
