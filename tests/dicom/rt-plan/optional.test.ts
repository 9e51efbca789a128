import { describe, expect, it } from 'vitest';
import { opt } from '../../../src/dicom/rt-plan/optional.js';

describe('opt', () => {
  it('a key with a value, nothing for undefined (so absent attributes stay absent, not undefined)', () => {
    expect(opt('a', 0)).toEqual({ a: 0 });
    expect(opt('a', '')).toEqual({ a: '' });
    expect(Object.keys(opt('a', undefined))).toEqual([]);
  });
});
