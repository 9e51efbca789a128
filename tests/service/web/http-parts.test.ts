import type http from 'node:http';
import { describe, expect, it } from 'vitest';
import { allowedHosts, allowedOrigins, cookieOf, isLoopback, sessionCookie } from '../../../src/service/web/http-parts.js';

describe('the page on the wire', () => {
  it('reads one cookie among several', () => {
    const req = { headers: { cookie: 'a=1; plumbline_session=abc=def; b=2' } } as unknown as http.IncomingMessage;
    expect(cookieOf(req, 'plumbline_session')).toBe('abc=def');
    expect(cookieOf(req, 'none')).toBeUndefined();
  });
  it('writes the sign-in cookie HttpOnly and SameSite=Strict, Secure only over TLS', () => {
    expect(sessionCookie('t', 60, false)).toBe('plumbline_session=t; HttpOnly; SameSite=Strict; Path=/; Max-Age=60');
    expect(sessionCookie('', 0, true)).toBe('plumbline_session=; HttpOnly; SameSite=Strict; Path=/; Max-Age=0; Secure');
  });
  it('answers to its host with its port (the loopback names on loopback); behind a proxy to its names alone too', () => {
    expect([...allowedHosts('127.0.0.1', 8470, [])].sort()).toEqual(['127.0.0.1:8470', '[::1]:8470', 'localhost:8470']);
    expect(allowedHosts('10.0.0.5', 8470, ['rounds.clinic.example'], true)).toEqual(
      new Set(['10.0.0.5:8470', 'rounds.clinic.example:8470', '10.0.0.5', 'rounds.clinic.example']),
    );
    expect(allowedOrigins('10.0.0.5', 8470, ['rounds.clinic.example'], 'https', true).has('https://rounds.clinic.example')).toBe(true);
    expect(isLoopback('127.0.0.2')).toBe(true);
    expect(isLoopback('0.0.0.0')).toBe(false);
  });
});
