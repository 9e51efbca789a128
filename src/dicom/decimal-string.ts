/**
 * Parses a backslash-separated DS or IS value strictly (PS3.5 6.2): each value is an optional sign,
 * digits with an optional fraction and, for DS, an optional exponent, with leading and trailing
 * spaces allowed. One scan, no regular expressions: leaf positions make this the importer's
 * hottest loop.
 *
 * Values with at most 15 significant digits and a small power of ten are computed as one exact
 * integer divided or multiplied by an exact power of ten: IEEE 754 rounds that single operation
 * correctly, so the result equals Number(text) (Clinger's fast path). Anything else goes to Number.
 */
export type NumberListResult =
  | { readonly ok: true; readonly values: number[] }
  | { readonly ok: false; readonly index: number; readonly count: number; readonly text: string };

const POW10 = Array.from({ length: 23 }, (_, i) => 10 ** i); // exact up to 1e22

/** The same for a string (tests and callers outside the reader). */
export function parseNumberList(text: string, integerOnly: boolean): NumberListResult {
  const bytes = new TextEncoder().encode(text);
  return parseNumberBytes(bytes, 0, bytes.length, integerOnly);
}

/** The same, straight from the element's bytes [from, to): no string is built for a valid value. */
export function parseNumberBytes(bytes: Uint8Array, from: number, to: number, integerOnly: boolean): NumberListResult {
  let count = 1;
  for (let i = from; i < to; i++) if (bytes[i] === BACKSLASH) count++;
  const values = new Array<number>(count);
  let start = from;
  for (let index = 0; index < count; index++) {
    let end = start;
    while (end < to && bytes[end] !== BACKSLASH) end++;
    let a = start;
    let b = end;
    while (a < b && isPad(bytes[a]!)) a++;
    while (b > a && isPad(bytes[b - 1]!)) b--;
    const v = parseOne(bytes, a, b, integerOnly);
    if (Number.isNaN(v)) return { ok: false, index, count, text: latin1(bytes, a, b) };
    values[index] = v;
    start = end + 1;
  }
  return { ok: true, values };
}

const BACKSLASH = 0x5c;
const latin1 = (b: Uint8Array, a: number, e: number) => String.fromCharCode(...b.subarray(a, e));

const isPad = (c: number) => c === 0x20 || c === 0x00;

/** The value of s[a, b), or NaN when it is not a valid DS (or IS) value. */
function parseOne(s: Uint8Array, a: number, b: number, integerOnly: boolean): number {
  let i = a;
  let negative = false;
  let c = s[i]!;
  if (i < b && (c === 0x2b || c === 0x2d)) {
    negative = c === 0x2d;
    i++;
  }
  let mantissa = 0;
  let significant = 0; // digits accumulated into mantissa, leading zeros excluded
  let digits = 0;
  let scale = 0; // decimal exponent of the mantissa's last digit
  while (i < b && (c = s[i]!) >= 0x30 && c <= 0x39) {
    if (mantissa !== 0 || c !== 0x30) {
      mantissa = mantissa * 10 + (c - 0x30);
      significant++;
    }
    digits++;
    i++;
  }
  if (integerOnly) {
    if (digits === 0 || i !== b) return NaN;
    return significant > 15 ? slow(s, a, b) : negative ? -mantissa : mantissa;
  }
  if (i < b && s[i]! === 0x2e) {
    i++;
    while (i < b && (c = s[i]!) >= 0x30 && c <= 0x39) {
      if (mantissa !== 0 || c !== 0x30) {
        mantissa = mantissa * 10 + (c - 0x30);
        significant++;
      }
      scale--;
      digits++;
      i++;
    }
  }
  if (digits === 0) return NaN;
  if (i < b && ((c = s[i]!) === 0x65 || c === 0x45)) {
    i++;
    let expNegative = false;
    c = s[i]!;
    if (i < b && (c === 0x2b || c === 0x2d)) {
      expNegative = c === 0x2d;
      i++;
    }
    let exp = 0;
    let expDigits = 0;
    while (i < b && (c = s[i]!) >= 0x30 && c <= 0x39) {
      exp = exp * 10 + (c - 0x30);
      expDigits++;
      i++;
      if (exp > 1e6) exp = 1e6; // beyond any double; keeps the sum finite
    }
    if (expDigits === 0) return NaN;
    scale += expNegative ? -exp : exp;
  }
  if (i !== b) return NaN;
  if (significant > 15 || scale < -22 || scale > 22) return slow(s, a, b);
  const magnitude = scale < 0 ? mantissa / POW10[-scale]! : mantissa * POW10[scale]!;
  return negative ? -magnitude : magnitude;
}

function slow(s: Uint8Array, a: number, b: number): number {
  const v = Number(latin1(s, a, b));
  // A valid DS can still overflow a double (1e999): that is not a usable number either.
  return Number.isFinite(v) ? v : NaN;
}
