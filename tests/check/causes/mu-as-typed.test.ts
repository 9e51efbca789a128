import { describe, expect, it } from 'vitest';
import { typingSlip } from '../../../src/check/causes/mu-as-typed.js';

describe('an MU as typed', () => {
  it('names typing slips: a digit too many, two digits swapped, a 1 for a 7', () => {
    expect(typingSlip(1234, 10)).toBe('a digit too many (×10)');
    expect(typingSlip(213, 213 / 123)).toMatch(/two digits swapped/);
    expect(typingSlip(171, 171 / 177)).toMatch(/a 1 typed for a 7/);
    expect(typingSlip(110, 1.1)).toBeUndefined();
  });
});
