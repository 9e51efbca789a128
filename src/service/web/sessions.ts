import { randomBytes } from 'node:crypto';
import type { Role } from '../history/store.js';

/** A signed-in user: who, in what role, until when, and the token every form of theirs must carry. */
export interface Session {
  readonly user: string;
  readonly role: Role;
  readonly expiresMs: number;
  readonly csrf: string;
}

const token = () => randomBytes(32).toString('base64url');

/**
 * Sign-ins of the page, in its memory: a random token in an HttpOnly cookie names one; it ends when
 * it expires, on sign-out, or when the page stops.
 */
export class Sessions {
  private readonly byToken = new Map<string, Session>();

  constructor(
    private readonly lifetimeMs: number,
    private readonly now: () => number,
  ) {}

  start(user: string, role: Role): { token: string; session: Session } {
    this.sweep();
    const t = token();
    const session = { user, role, expiresMs: this.now() + this.lifetimeMs, csrf: token() };
    this.byToken.set(t, session);
    return { token: t, session };
  }

  get(t: string | undefined): Session | undefined {
    const s = t ? this.byToken.get(t) : undefined;
    if (s && s.expiresMs <= this.now()) {
      this.byToken.delete(t!);
      return undefined;
    }
    return s;
  }

  end(t: string | undefined): void {
    if (t) this.byToken.delete(t);
  }

  private sweep(): void {
    const now = this.now();
    for (const [t, s] of this.byToken) if (s.expiresMs <= now) this.byToken.delete(t);
  }
}

/** Failed sign-ins allowed per client address and per account name within the window (common practice, no source). */
export const MAX_FAILURES = 5;
export const FAILURE_WINDOW_MS = 15 * 60_000;

/** Sign-in attempts, limited: past MAX_FAILURES failures in the window, for the address or the name, attempts are refused. */
export class SignInLimiter {
  private readonly failures = new Map<string, number[]>();

  constructor(private readonly now: () => number) {}

  blocked(address: string, name: string): boolean {
    return [`a:${address}`, `n:${name}`].some((k) => this.recent(k).length >= MAX_FAILURES);
  }

  failed(address: string, name: string): void {
    for (const k of [`a:${address}`, `n:${name}`]) this.failures.set(k, [...this.recent(k), this.now()]);
  }

  succeeded(address: string, name: string): void {
    this.failures.delete(`a:${address}`);
    this.failures.delete(`n:${name}`);
  }

  private recent(k: string): number[] {
    const since = this.now() - FAILURE_WINDOW_MS;
    return (this.failures.get(k) ?? []).filter((t) => t > since);
  }
}
