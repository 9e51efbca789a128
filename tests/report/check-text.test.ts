/**
 * The terminal report of the demo clinic: it fits 120 columns, a row of the factor table multiplies
 * to its dose per MU, a warning every plan shares is said once, and the plans to look at are named.
 * (Presentation rules of the project; the factor product is the TG-71 point-dose formalism.)
 */
import { describe, expect, it } from 'vitest';
import { checkText } from '../../src/report/check-text.js';
import { demoClinicDocument } from '../helpers/demo-document.js';

const { plans, doc } = demoClinicDocument();

describe('the terminal report', () => {
  const text = checkText(doc, { factors: true });

  it('fits 120 columns, factor table included', () => {
    expect(text.filter((l) => [...l].length > 120)).toEqual([]);
  });

  it("prints each checked beam's factors so that they multiply to its dose per MU", () => {
    let rows = 0;
    for (let i = 0; i < text.length; i++) {
      if (!text[i]!.trimStart().startsWith('beam  off-axis cm')) continue;
      const header = text[i]!.trim().split(/\s{2,}/);
      for (let j = i + 1; j < text.length && /^\s+\d/.test(text[j]!); j++) {
        const cells = text[j]!.trim().split(/\s{2,}/);
        const value = (h: string) => Number(cells[header.indexOf(h)]);
        const factors = header.slice(4, -1).filter((h) => cells[header.indexOf(h)] !== '—');
        const product = factors.reduce((p, h) => p * (h === 'PDD %' ? value(h) / 100 : value(h)), 1);
        expect(product / value('D/MU cGy')).toBeCloseTo(1, 3);
        rows++;
      }
    }
    expect(rows).toBe(plans.flatMap((p) => p.fractionGroups.flatMap((g) => g.beams)).filter((b) => b.status === 'checked').length);
  });

  it('says a warning every plan shares once, with how many plans it concerns', () => {
    expect(text.filter((l) => l.includes("no CT series in this plan's frame of reference"))).toEqual([
      "warning for 6 plans: no CT series in this plan's frame of reference among --ct: checked without CT",
    ]);
  });

  it('names the plans to look at in the closing summary', () => {
    const at = text.indexOf('to look at:');
    expect(at).toBeGreaterThan(0);
    const named = text.slice(at + 1).filter((l) => l.startsWith('  "'));
    expect(named.length).toBe(plans.filter((p) => p.verdict !== 'within tolerance' || !p.fullyVerified).length);
    expect(named.some((l) => l.includes('L BREAST TG') && l.includes('beyond action level'))).toBe(true);
  });
});
