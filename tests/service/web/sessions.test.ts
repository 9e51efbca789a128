import { describe, expect, it } from 'vitest';
import { FAILURE_WINDOW_MS, MAX_FAILURES, Sessions, SignInLimiter } from '../../../src/service/web/sessions.js';

describe('sign-ins', () => {
  it('last their lifetime, each with its own token and CSRF token, and end on sign-out', () => {
    let now = 0;
    const s = new Sessions(1000, () => now);
    const a = s.start('A', 'physicist');
    const b = s.start('B', 'viewer');
    expect(a.token).not.toBe(b.token);
    expect(a.session.csrf).not.toBe(b.session.csrf);
    expect(s.get(a.token)?.user).toBe('A');
    now = 999;
    expect(s.get(a.token)).toBeDefined();
    now = 1000;
    expect(s.get(a.token)).toBeUndefined();
    const c = s.start('C', 'viewer');
    s.end(c.token);
    expect(s.get(c.token)).toBeUndefined();
    expect(s.get(undefined)).toBeUndefined();
  });
  it(`are refused after ${MAX_FAILURES} failures for an address or a name within the window, and allowed again after it`, () => {
    let now = 0;
    const l = new SignInLimiter(() => now);
    for (let i = 0; i < MAX_FAILURES - 1; i++) l.failed('10.0.0.1', 'A');
    expect(l.blocked('10.0.0.1', 'A')).toBe(false);
    l.failed('10.0.0.1', 'A');
    expect(l.blocked('10.0.0.1', 'B')).toBe(true); // the address
    expect(l.blocked('10.0.0.2', 'A')).toBe(true); // the name
    expect(l.blocked('10.0.0.2', 'B')).toBe(false);
    now = FAILURE_WINDOW_MS + 1;
    expect(l.blocked('10.0.0.1', 'A')).toBe(false);
  });
});
