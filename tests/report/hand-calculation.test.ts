/** A calculation written as by hand, on Khan's SSD example (Sc 1.020, Sp 1.010, %DD 65.1, inputs read; 298 MU from memory). */
import { describe, expect, it } from 'vitest';
import type { Factor } from '../../src/model/index.js';
import { handCalculation } from '../../src/report/hand-calculation.js';

const factors: Factor[] = [
  { key: 'Sc', value: 1.02, args: [15, 15] },
  { key: 'Sp', value: 1.01, args: [15] },
  { key: 'PDD', value: 0.651, args: [10, 15, 100] },
];
const dpm = 1.02 * 1.01 * 0.651;

describe('handCalculation', () => {
  it('one factor per line, the dose per MU, then the MU for the dose: 200 cGy / 0.6707 cGy/MU = 298.2 MU', () => {
    const lines = handCalculation(factors, dpm, { given: 'dose', doseCGy: 200, mu: 200 / dpm });
    expect(lines.slice(0, 3).map((l) => l.split('=').at(-1)!.trim())).toEqual(['1.0200', '1.0100', '0.6510']);
    expect(lines[3]).toMatch(/dose per MU\s+= 0\.6707 cGy\/MU$/);
    expect(lines.at(-1)).toBe('  MU = 200 cGy / 0.6707 cGy/MU = 298.2 MU');
  });
  it('or the dose for the MU', () => {
    expect(handCalculation(factors, dpm, { given: 'mu', mu: 298, doseCGy: 298 * dpm }).at(-1)).toBe('  dose = 298 MU x 0.6707 cGy/MU = 199.9 cGy');
  });
});
