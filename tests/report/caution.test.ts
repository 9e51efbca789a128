import { describe, expect, it } from 'vitest';
import { CAUTION } from '../../src/report/caution.js';

describe('the caution printed with every output', () => {
  it("says an aid to, never a replacement for, a physicist's review; the clinic's own validated beam data; local rules prevail", () => {
    expect(CAUTION).toMatch(/an aid to, never a replacement for, the review of a qualified medical physicist/);
    expect(CAUTION).toMatch(/Beam data must be the clinic's own, commissioned and validated/);
    expect(CAUTION).toMatch(/Local regulations and licensed practice prevail/);
  });
});
