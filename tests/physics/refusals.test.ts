import { describe, expect, it } from 'vitest';
import { refusals } from '../../src/physics/refusals.js';

describe('refused lookups', () => {
  it('each lookup outside its table where no clamp is allowed is an issue with the range and the value', () => {
    const [i] = refusals(
      [
        { table: 'TMR', axis: 'depth', requested: 42, used: 35, kind: 'out-of-range', range: [0, 35], unit: 'cm' },
        { table: 'Sc', axis: 'side', requested: 1, used: 2, kind: 'clamped', range: [2, 40], unit: 'cm' },
      ],
      '6X',
    );
    expect(i).toMatchObject({ code: 'out-of-range', expected: 'depth within 0.00 to 35.00 cm', found: '42.00 cm' });
  });
  it('a factor that is not finite without a refused lookup is a data problem of the beam', () => {
    expect(refusals([], '6X')).toEqual([{ severity: 'error', code: 'physical-range', message: 'beam 6X: a factor is not a finite number' }]);
  });
});
