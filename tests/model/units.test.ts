import { describe, expect, it } from 'vitest';
import { CGY_PER_GY, cGyFromGy, MM_PER_CM } from '../../src/model/units.js';

describe('units', () => {
  it('DICOM gives Gy and mm; the formalism speaks cGy and cm (SI: 1 Gy = 100 cGy, 1 cm = 10 mm)', () => {
    expect(CGY_PER_GY).toBe(100);
    expect(cGyFromGy(1.8)).toBeCloseTo(180, 12);
    expect(MM_PER_CM).toBe(10);
  });
});
