import { describe, expect, it } from 'vitest';
import { formatDS, formatIS } from '../../scripts/lib/format-ds.js';
import { parseNumberList } from '../../src/dicom/decimal-string.js';

describe('DS formatting for the fixture writer', () => {
  it('rounds to 16 characters instead of truncating (dcmjs drops the exponent of 1.2345678901234567e-7)', () => {
    // The value and dcmjs's truncated output were observed with dcmjs 0.51.1 (from the project's DICOM notes).
    // biome-ignore lint/correctness/noPrecisionLoss: the literal is dcmjs's own test value, more digits than a double keeps on purpose
    expect(formatDS(1.2345678901234567e-7)).toBe('1.23456789012e-7');
    expect(formatDS(0.1 + 0.2)).toBe('0.3');
    expect(formatDS(-1234.5678901234567)).toBe('-1234.5678901235');
    expect(formatDS(-0)).toBe('0');
  });
  it('always yields a valid DS of at most 16 characters that reads back within its precision', () => {
    // biome-ignore lint/correctness/noPrecisionLoss: a 18-digit integer beyond a double's precision on purpose
    for (const x of [1e21, -1e-300, 123456789012345678, Math.PI, -Math.E * 1e5, 5e-324]) {
      const s = formatDS(x);
      expect(s.length).toBeLessThanOrEqual(16);
      const r = parseNumberList(s, false);
      expect(r.ok).toBe(true);
      if (r.ok) expect(Math.abs(r.values[0]! - x)).toBeLessThanOrEqual(Math.abs(x) * 1e-10);
    }
  });
  it('refuses what DS and IS cannot encode', () => {
    expect(() => formatDS(Number.NaN)).toThrow();
    expect(() => formatIS(25.5)).toThrow();
  });
});
