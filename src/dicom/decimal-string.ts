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

export function parseNumberList(text: string, integerOnly: boolean): NumberListResult {
  const values: number[] = [];
  const n = text.length;
  let start = 0;
  let index = 0;
  while (start <= n) {
    let end = text.indexOf('\\', start);
    if (end < 0) end = n;
    let a = start;
    let b = end;
    while (a < b && isPad(text.charCodeAt(a))) a++;
    while (b > a && isPad(text.charCodeAt(b - 1))) b--;
    const v = parseOne(text, a, b, integerOnly);
    if (Number.isNaN(v)) return { ok: false, index, count: countValues(text), text: text.slice(a, b) };
    values.push(v);
    index++;
    start = end + 1;
  }
  return { ok: true, values };
}

const isPad = (c: number) => c === 0x20 || c === 0x00;

/** The value of s[a, b), or NaN when it is not a valid DS (or IS) value. */
function parseOne(s: string, a: number, b: number, integerOnly: boolean): number {
  let i = a;
  let negative = false;
  let c = s.charCodeAt(i);
  if (i < b && (c === 0x2b || c === 0x2d)) {
    negative = c === 0x2d;
    i++;
  }
  let mantissa = 0;
  let significant = 0; // digits accumulated into mantissa, leading zeros excluded
  let digits = 0;
  let scale = 0; // decimal exponent of the mantissa's last digit
  while (i < b && (c = s.charCodeAt(i)) >= 0x30 && c <= 0x39) {
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
  if (i < b && s.charCodeAt(i) === 0x2e) {
    i++;
    while (i < b && (c = s.charCodeAt(i)) >= 0x30 && c <= 0x39) {
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
  if (i < b && ((c = s.charCodeAt(i)) === 0x65 || c === 0x45)) {
    i++;
    let expNegative = false;
    c = s.charCodeAt(i);
    if (i < b && (c === 0x2b || c === 0x2d)) {
      expNegative = c === 0x2d;
      i++;
    }
    let exp = 0;
    let expDigits = 0;
    while (i < b && (c = s.charCodeAt(i)) >= 0x30 && c <= 0x39) {
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

function slow(s: string, a: number, b: number): number {
  const v = Number(s.slice(a, b));
  // A valid DS can still overflow a double (1e999): that is not a usable number either.
  return Number.isFinite(v) ? v : NaN;
}

function countValues(s: string): number {
  let c = 1;
  for (let i = 0; i < s.length; i++) if (s.charCodeAt(i) === 0x5c) c++;
  return c;
}
