import { describe, expect, it } from 'vitest';
import { parseNumberList } from '../../src/dicom/decimal-string.js';

/** The reference for every valid value is ECMAScript's own Number(string) conversion. */
describe('DS and IS parsing', () => {
  it('accepts what PS3.5 6.2 allows and equals Number() exactly', () => {
    const valid = [
      '0',
      '-0',
      '+1',
      '1.',
      '.5',
      '-.5',
      '239.531250000000',
      '-741.87000000000',
      '9.9902680e-1',
      '1E3',
      '1e+21',
      '1.2345678901234567e-7',
      '  12.5 ',
      '0.1',
      '1234567890123456789',
      '4.9e-324',
      '1.7976931348623157e308',
      '-100.00000000000',
    ];
    for (const v of valid) {
      const r = parseNumberList(v, false);
      expect(r.ok, v).toBe(true);
      if (r.ok) expect(Object.is(r.values[0], Number(v.trim())), v).toBe(true);
    }
  });

  it('agrees with Number() on 20 000 random decimal strings', () => {
    let seed = 12345;
    const rnd = () => (seed = (seed * 1103515245 + 12345) & 0x7fffffff) / 0x7fffffff;
    for (let k = 0; k < 20000; k++) {
      const intPart = String(Math.floor(rnd() * 10 ** Math.floor(rnd() * 12)));
      const frac = rnd() < 0.7 ? `.${String(Math.floor(rnd() * 10 ** Math.floor(rnd() * 10))).padStart(Math.floor(rnd() * 6), '0')}` : '';
      const exp = rnd() < 0.2 ? `e${rnd() < 0.5 ? '-' : ''}${Math.floor(rnd() * 30)}` : '';
      const text = `${rnd() < 0.3 ? '-' : ''}${intPart}${frac}${exp}`;
      const r = parseNumberList(text, false);
      expect(r.ok && Object.is(r.values[0], Number(text)), text).toBe(true);
    }
  });

  it('refuses what is not a number, naming the value', () => {
    for (const bad of ['', 'abc', '1.2.3', 'NaN', 'Infinity', '1e', '--1', '1,5', '0x10', '1e999', '+', '.']) {
      const r = parseNumberList(bad, false);
      expect(r.ok, JSON.stringify(bad)).toBe(false);
    }
    const r = parseNumberList('1\\2\\x\\4', false);
    expect(r).toEqual({ ok: false, index: 2, count: 4, text: 'x' });
  });

  it('reads IS as integers only', () => {
    expect(parseNumberList('-12\\+7\\0', true)).toEqual({ ok: true, values: [-12, 7, 0] });
    expect(parseNumberList('25.5', true).ok).toBe(false);
    expect(parseNumberList('1e3', true).ok).toBe(false);
  });
});
