/** The CT volume's memory and its in-place rescale: every value gets the intercept, SIMD body and scalar tail alike. */
import { describe, expect, it } from 'vitest';
import { addInPlace, allocateInt16 } from '../../src/dicom/int16-volume.js';

describe('the Int16 volume', () => {
  it('adds the intercept to every value, including a tail shorter than eight values and a slice at an offset', () => {
    const v = allocateInt16(1003);
    for (let i = 0; i < v.length; i++) v[i] = (i * 37) % 4096;
    addInPlace(v.subarray(8), -1024); // a slice starting 16 bytes in
    addInPlace(v.subarray(0, 8), -1024);
    for (let i = 0; i < v.length; i++) if (v[i] !== ((i * 37) % 4096) - 1024) throw new Error(`value ${i}: ${v[i]}`);
    expect(v.length).toBe(1003);
  });
  it('works on a slice that is not 16-byte aligned (the scalar path)', () => {
    const v = allocateInt16(100);
    v.fill(5);
    addInPlace(v.subarray(3, 50), 7);
    expect([v[2], v[3], v[49], v[50]]).toEqual([5, 12, 12, 5]);
  });
});
