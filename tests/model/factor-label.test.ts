import { describe, expect, it } from 'vitest';
import { factorLabel } from '../../src/model/factor-label.js';

describe('a factor as written by hand', () => {
  it('with its arguments in cm and where its value came from', () => {
    expect(factorLabel({ key: 'D0', value: 1, args: [] })).toBe("D'0 (cGy/MU)");
    expect(factorLabel({ key: 'Sc', value: 1, args: [12.345] })).toBe('Sc(12.35 cm)');
    expect(factorLabel({ key: 'TPR', value: 0.8, args: [10, 11.5], name: 'TMR' })).toBe('TMR(10 cm, 11.5 cm)');
    expect(factorLabel({ key: 'PDD', value: 0.67, args: [10, 10, 100], name: 'from-tpr' })).toBe(
      'PDD(10 cm, 10 cm, SSD 100 cm)/100 (from the TPR table at this SSD, normalised at d0)',
    );
  });
});
