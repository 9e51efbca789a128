/**
 * A JS number as a DICOM DS string (at most 16 characters), rounded rather than truncated:
 * dcmjs truncates long DS strings and can drop the exponent, so every DS we write goes through here.
 */
export function formatDS(x: number): string {
  if (!Number.isFinite(x)) throw new RangeError(`DS cannot encode ${x}`);
  if (Object.is(x, -0)) x = 0;
  for (let p = 16; p >= 1; p--) {
    let s = x.toPrecision(p);
    s = s.includes('e') ? s.replace(/\.?0+e/, 'e') : s.includes('.') ? s.replace(/\.?0+$/, '') : s;
    if (s.length <= 16) return s;
  }
  throw new RangeError(`cannot fit ${x} in DS`);
}

/** An IS string; refuses non-integers instead of writing an invalid value. */
export function formatIS(n: number): string {
  if (!Number.isInteger(n)) throw new RangeError(`IS cannot encode ${n}`);
  return String(n);
}
