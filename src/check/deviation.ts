/**
 * A part in percent of a whole, 100·part/whole: undefined when the whole is not a positive finite
 * number or the result is not finite (nothing to compare with), never Infinity or NaN.
 */
export function percentOf(part: number, whole: number): number | undefined {
  if (!(whole > 0) || !Number.isFinite(whole)) return undefined;
  const p = (100 * part) / whole;
  return Number.isFinite(p) ? p : undefined;
}

/**
 * The percent deviation of a value from a reference, 100·(value − reference)/reference, guarded as
 * `percentOf`. Every deviation the check reports goes through here.
 */
export function percentDeviation(value: number, reference: number): number | undefined {
  return percentOf(value - reference, reference);
}
