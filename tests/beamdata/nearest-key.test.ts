import { describe, expect, it } from 'vitest';
import { nearestKey } from '../../src/beamdata/nearest-key.js';

describe('the nearest manifest key to a mistyped one', () => {
  it('suggests a key two letters away, and nothing for a word far from every key', () => {
    expect(nearestKey('dosimetricLeafGapMM')).toBe('dosimetricLeafGapMm');
    expect(nearestKey('mlcTransmision')).toBe('mlcTransmission');
    expect(nearestKey('favouriteColourOfTheDay')).toBeUndefined();
  });
});
