import { describe, expect, it } from 'vitest';
import { withSignOff } from '../../../src/service/web/sign-off.js';

const review = {
  id: 1,
  checkId: 1,
  reviewer: 'Dr <A>',
  reviewerRole: 'physicist' as const,
  reviewedAt: '2026-12-03T08:15:00.000Z',
  accepted: true,
  comment: 'ok & fine',
};

describe('the sign-off of a stored report', () => {
  it('is added before the end of the body once reviewed, its values escaped', () => {
    const html = withSignOff('<html><body><p>report</p></body></html>', [review]);
    expect(html).toMatch(
      /<p>report<\/p><section class="sign-off".*<td>Dr &lt;A&gt;<\/td><td>physicist<\/td><td>2026-12-03 08:15<\/td><td>accepted<\/td><td>ok &amp; fine<\/td>.*<\/section>\n<\/body>/s,
    );
  });
  it('leaves a report without review as it is, and says a role unknown for a review recorded before sign-in', () => {
    expect(withSignOff('<body>x</body>', [])).toBe('<body>x</body>');
    const { reviewerRole: _, ...old } = review;
    expect(withSignOff('<body>x</body>', [old])).toContain('<td>—</td>');
  });
});
