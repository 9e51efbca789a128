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
  it("words a total's causes by their beams, and a cause without a share as such", () => {
    const total: Explanation = {
      deviationPercent: 3,
      causes: [
        { code: 'depth', beams: [1, 3], contributionPercent: 2.5, confidence: 'measured', evidence: { beams: '1, 3' } },
        {
          code: 'machine-alias',
          contributionPercent: 0,
          estimated: false,
          confidence: 'possible',
          evidence: { planMachine: 'A', beamData: 'B', via: 'x' },
        },
      ],
      residualPercent: 0.49,
      unexplained: false,
    };
    const lines = explanationLines(total);
    expect(lines[1]).toBe('depth differs (beams 1, 3): +2.5 % (measured)');
    expect(lines[2]).toBe("the plan's machine A checked with the beam data of B (x): share not estimated (possible)");
  });
  it('words the field edge, the leaf ends, the extended SSD and a clamped table with their numbers', () => {
    const line = (code: Explanation['causes'][number]['code'], evidence: Record<string, number | string>) =>
      explanationLines({
        deviationPercent: 1,
        causes: [{ code, contributionPercent: 1, confidence: 'possible', evidence }],
        residualPercent: 0,
        unexplained: false,
      })[1];
    expect(line('field-edge', { edgeDistanceCm: 0.3, edgeChangeFor2MmPercent: 23.7, penumbraMm: 6 })).toBe(
      'the point 0.3 cm from the field edge: the dose there changes 23.7 % for a 2 mm shift (a 6 mm penumbra assumed): +1.0 % (possible)',
    );
    expect(line('leaf-end-offset', { gapMm: 1.5, spreadMm: 0.5, sensitivityPercent: 0.8, narrowMuPercent: 40 })).toContain(
      "0.5 mm wider than the beam data's 1.5 mm our dose moves 0.8 % (40 % of the MU through openings under 2 cm at the point)",
    );
    expect(line('extended-ssd', { ssdCm: 120, largeSsdCm: 110, mayneordAgainstTprPercent: -1.2 })).toContain('Mayneord F factor differs -1.2 %');
    expect(line('table-edge', { table: 'TMR', axis: 'depth', requested: 38, used: 35, unit: 'cm', clamps: 2 })).toContain(
      "TMR looked up at depth 38.00 cm, used at the table's edge 35.00 (and 1 more)",
    );
  });
});
