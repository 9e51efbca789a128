import { describe, expect, it } from 'vitest';
import { InternalError } from '../src/errors.js';

describe('the one thrown error', () => {
  it('is named as a bug and keeps its cause', () => {
    const cause = new Error('below');
    const e = new InternalError('a state the code should never reach', { cause });
    expect(e).toBeInstanceOf(Error);
    expect(e.name).toBe('InternalError');
    expect(e.cause).toBe(cause);
  });
});
