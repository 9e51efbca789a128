/** The explanation of a deviation in words and as bars (the numbers are the check's; wording only). */
import { describe, expect, it } from 'vitest';
import type { Explanation } from '../../src/model/index.js';
import { explanationHtml, explanationLines } from '../../src/report/explanation-text.js';

const e: Explanation = {
  deviationPercent: 10.25,
  causes: [
    {
      code: 'mu-as-typed',
      contributionPercent: 11.25,
      confidence: 'possible',
      evidence: { plannedMu: 149.4, muAtTheOtherBeamsAgreement: 134.3, othersMeanDeviationPercent: -0.89 },
    },
  ],
  residualPercent: -0.89,
  unexplained: false,
};

describe('explanation text', () => {
  it('says each cause with its evidence, contribution and confidence, then what is left', () => {
    expect(explanationLines(e)).toEqual([
      'why it may differ (+10.3 %): left: -0.9 %',
      "MU as typed? 149.4 MU planned; 134.3 MU would agree as the plan's other beams do (-0.9 %): +11.3 % (possible)",
    ]);
    expect(explanationLines({ ...e, causes: [], residualPercent: 10.25, unexplained: true })[0]).toContain(
      'not explained by the causes plumbline knows',
    );
  });
  it('draws a bar per cause and one for the residual, escaped', () => {
    const html = explanationHtml(e);
    expect(html.match(/<svg/g)).toHaveLength(2);
    expect(html).toContain('left unexplained');
    expect(html).toContain('the plan&#39;s other beams');
  });
});
