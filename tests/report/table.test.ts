/** Wrapping the terminal report's prose (presentation rules of the project). */
import { describe, expect, it } from 'vitest';
import { wrap } from '../../src/report/table.js';

describe('wrapping a line', () => {
  it('cuts at spaces within the width and indents the continuation', () => {
    const lines = wrap('the point is 1.2 cm from the field edge (margin 1.5 cm) and more words follow here', 30, '    ');
    expect(lines.every((l) => l.length <= 30)).toBe(true);
    expect(lines.slice(1).every((l) => l.startsWith('    '))).toBe(true);
    expect(lines.map((l) => l.trim()).join(' ')).toBe('the point is 1.2 cm from the field edge (margin 1.5 cm) and more words follow here');
  });
  it('never separates a number from its unit', () => {
    for (let width = 10; width < 40; width++) {
      for (const l of wrap('tolerance 2.5 %, action level 3.5 %, depth 10.0 cm', width, '  ')) expect(l.trimStart()).not.toMatch(/^(%|cm)\b/);
    }
  });
});
