/**
 * The HTML report of the demo clinic: one self-contained page with the caution twice, every beam's
 * hand calculation with its worded reasons, and text from the plans escaped (project rules).
 */
import { describe, expect, it } from 'vitest';
import { checkHtml } from '../../src/report/check-html.js';
import { escapeHtml } from '../../src/report/html-escape.js';
import { demoClinicDocument } from '../helpers/demo-document.js';

const { plans, doc } = demoClinicDocument();

describe('the HTML report', () => {
  const html = checkHtml(doc);
  it('is self-contained and carries the caution at the top and the bottom', () => {
    expect(html).not.toMatch(/<script|<link|src="http/);
    expect(html.split(escapeHtml(doc.caution)).length - 1).toBe(2);
  });
  it("writes a hand calculation for every beam, with the check's notes in words", () => {
    const beams = plans.flatMap((p) => p.fractionGroups.flatMap((g) => g.beams));
    expect(html.match(/<section class="beam">/g)).toHaveLength(beams.filter((b) => b.status === 'checked').length);
    expect(html).toContain('the Beam Dose Specification Point of the beam in the fraction group');
    expect(html).toContain('modified Clarkson integration');
    expect(html).not.toMatch(/\[object Object\]|undefined/);
  });
  it('escapes text that comes from a plan', () => {
    const [first] = doc.plans;
    const hostile = checkHtml({ ...doc, plans: [{ ...first!, planLabel: `<img src=x onerror="alert('x')">` }] });
    expect(hostile).not.toContain('<img src=x');
    expect(hostile).toContain('&lt;img src=x onerror=&quot;alert(&#39;x&#39;)&quot;&gt;');
  });
});
