/** No control character from outside reaches a terminal (project rule: a crafted label must not rewrite the report). */
import { describe, expect, it } from 'vitest';
import { printable, printableLines } from '../../src/model/index.js';

describe('printable text', () => {
  it('shows ESC, BEL, CR, NUL and C1 controls as U+FFFD', () => {
    expect(printable('A\u001b[2K\rB\u0007C\u0000D\u009bE')).toBe('A\ufffd[2K\ufffdB\ufffdC\ufffdD\ufffdE');
  });
  it('leaves ordinary text, accents included, as it is', () => {
    expect(printable('Müller^Zoë 6 MV')).toBe('Müller^Zoë 6 MV');
  });
  it("keeps the report's own line breaks and tabs", () => {
    expect(printableLines('a\n\tb\u001bc')).toBe('a\n\tb\ufffdc');
  });
});
