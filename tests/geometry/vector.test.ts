import { describe, expect, it } from 'vitest';
import { add, apply, dot, multiply, norm, rotationY, rotationZ, scale, sub, transpose } from '../../src/geometry/vector.js';

const close = (a: readonly number[], b: readonly number[]) => a.forEach((v, i) => expect(v).toBeCloseTo(b[i]!, 12));

describe('vectors and rotations', () => {
  it('adds, subtracts, scales, dots and measures', () => {
    expect(add([1, 2, 3], [4, 5, 6])).toEqual([5, 7, 9]);
    expect(sub([1, 2, 3], [4, 5, 6])).toEqual([-3, -3, -3]);
    expect(scale([1, -2, 3], 2)).toEqual([2, -4, 6]);
    expect(dot([1, 2, 3], [4, 5, 6])).toBe(32);
    expect(norm([3, 4, 12])).toBe(13);
  });
  it('rotates right-handedly: +90° about z takes x to y, about y takes z to x', () => {
    close(apply(rotationZ(90), [1, 0, 0]), [0, 1, 0]);
    close(apply(rotationY(90), [0, 0, 1]), [1, 0, 0]);
  });
  it('a rotation times its transpose is the identity; rotations compose', () => {
    const r = multiply(rotationZ(30), rotationY(-70));
    const i = multiply(r, transpose(r));
    i.forEach((row, k) =>
      close(
        row,
        [0, 1, 2].map((j) => (j === k ? 1 : 0)),
      ),
    );
    close(apply(multiply(rotationZ(30), rotationZ(60)), [1, 0, 0]), apply(rotationZ(90), [1, 0, 0]));
  });
});
