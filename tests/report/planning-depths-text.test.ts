import { describe, expect, it } from 'vitest';
import { planningDepthsText } from '../../src/report/planning-depths-text.js';

describe("the planning system's own depths in words", () => {
  it('each depth it states, with ours beside it when known', () => {
    expect(planningDepthsText({ depthMm: 98, depthDifferenceMm: 2, equivalentDepthMm: 85.25, ssdMm: 902 })).toBe(
      "the planning system's own depth 98.0 mm (ours +2.0 mm), equivalent depth 85.3 mm, SSD 902.0 mm",
    );
    expect(planningDepthsText({ ssdMm: 900, ssdDifferenceMm: -1.5 }, 'the plan states')).toBe('the plan states SSD 900.0 mm (ours -1.5 mm)');
  });
});
