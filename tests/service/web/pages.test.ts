import { describe, expect, it } from 'vitest';
import { checkPage, listPage, signInPage } from '../../../src/service/web/pages.js';
import type { Session } from '../../../src/service/web/sessions.js';

const record = {
  id: 3,
  recordedAt: '2026-12-01T09:00:00.000Z',
  planSopInstanceUid: '2.25.1',
  planSha256: 'a',
  planLabel: 'P <1>',
  verdict: 'needs review' as const,
  fullyVerified: false,
  toolVersion: 't',
  inputs: [],
};
const result = { planLabel: 'P <1>', verdict: 'needs review' as const, fullyVerified: false, fractionGroups: [] };
const physicist: Session = { user: 'Dr A', role: 'physicist', expiresMs: 0, csrf: 'tok"en' };

describe('the pages', () => {
  it('the sign-in page says how to make the first account only when there is none', () => {
    expect(signInPage(true)).toContain('plumbline users add NAME --role physicist');
    expect(signInPage(false)).not.toContain('users add');
    expect(signInPage(false, 'The name or the password is not right.')).toContain('id="signin-error"');
  });
  it("a check's page: a physicist's form with the sign-in's token, the title as the report words it; a viewer reads", () => {
    const page = checkPage(record, result, [], physicist);
    expect(page).toContain('<title>P &lt;1&gt;: needs review, not fully verified — plumbline</title>');
    expect(page).toContain('<input type="hidden" name="csrf" value="tok&quot;en">');
    expect(page).not.toContain('name="reviewer"');
    expect(checkPage(record, result, [], { ...physicist, role: 'viewer' })).toContain('id="read-only"');
  });
  it('the list says when nothing waits for a review', () => {
    const page = listPage({
      queue: [],
      checks: [],
      filter: { since: '2026-12-01' },
      machines: [],
      trend: [],
      notChecked: [],
      ignoredFilters: [],
      who: physicist,
    });
    expect(page).toContain('Nothing waits for a review.');
    expect(page).toContain('<span id="who">Dr A (physicist)</span>');
  });
});
