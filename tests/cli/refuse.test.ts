import { describe, expect, it } from 'vitest';
import { refuseOptions } from '../../src/cli/refuse.js';

describe('options that cannot be used', () => {
  it('one line per problem on stderr, exit 2', () => {
    expect(refuseOptions(['--point needs three numbers', '--mu must be positive'])).toEqual({
      stdout: [],
      stderr: ['error: --point needs three numbers [invalid-option]', 'error: --mu must be positive [invalid-option]'],
      exitCode: 2,
    });
  });
});
