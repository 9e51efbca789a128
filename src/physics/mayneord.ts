import { inverseSquareFactor } from './inverse-square.js';

/**
 * Mayneord F factor: the PDD at SSD f2 from the PDD at f1 for the same depth and surface field,
 * F = ((f2 + dmax)/(f1 + dmax))² · ((f1 + d)/(f2 + d))². Accounts for the inverse square law only
 * (not for the change in scatter), so the engine converts through TPR instead and keeps this for
 * comparison.
 */
export function mayneordFactor(ssd1Cm: number, ssd2Cm: number, depthCm: number, dmaxCm: number): number {
  return inverseSquareFactor(ssd2Cm + dmaxCm, ssd1Cm + dmaxCm) * inverseSquareFactor(ssd1Cm + depthCm, ssd2Cm + depthCm);
}
