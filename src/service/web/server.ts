import http from 'node:http';
import https from 'node:https';
import type net from 'node:net';
import { z } from 'zod';
import { PlanVerdict } from '../../model/index.js';
import { chartRoundEntry, techniqueOf, topCause } from '../history/chart-round.js';
import type { HistoryStore } from '../history/store.js';
import { allowedHosts, allowedOrigins, cookieOf, readForm, redirect, SESSION_COOKIE, send, sessionCookie } from './http-parts.js';
import { checkPage, listPage, notFoundPage, signInPage, type TrendPoint } from './pages.js';
import { verifyPassword } from './passwords.js';
import { type Session, Sessions, SignInLimiter } from './sessions.js';
import { withSignOff } from './sign-off.js';

export { isLoopback } from './http-parts.js';

const DAY_MS = 86_400_000;
const HOUR_MS = 3_600_000;

const ListQuery = z.object({
  since: z
    .string()
    .regex(/^\d{4}-\d{2}-\d{2}$/)
    .optional()
    .catch(undefined),
  machine: z.string().min(1).max(64).optional().catch(undefined),
  verdict: PlanVerdict.optional().catch(undefined),
});
const ReviewForm = z.object({
  csrf: z.string().min(1),
  accepted: z.enum(['yes', 'no'], { message: 'say whether the check is accepted' }),
  comment: z.string().max(500).default(''),
});
const SignInForm = z.object({ name: z.string().trim().min(1).max(64), password: z.string().min(1).max(1024) });

export interface WebServerOptions {
  host: string;
  port: number;
  history: HistoryStore;
  /** Further names the page may be reached by (a DNS name of this machine); the configured host always. */
  hostNames?: readonly string[];
  /** Serve over TLS with this certificate and key (PEM). */
  tls?: { cert: string | Buffer; key: string | Buffer };
  /** A reverse proxy in front does TLS: cookies say Secure, the proxy's names are accepted without a port. */
  behindProxy?: boolean;
  /** Hours a sign-in lasts (8 by default). */
  sessionHours?: number;
  now?: () => number;
  log: (l: string) => void;
}
/**
 * The chart-round page: signed-in users only (a physicist reviews, a viewer reads), every form with
 * its sign-in's CSRF token, sign-in attempts limited. Read-only over the history, except a review,
 * which adds a record under the signed-in name. Every value from a request is parsed (zod) before
 * use; pages escape everything.
 */
export function startWebServer(o: WebServerOptions): Promise<{ port: number; close: () => Promise<void> }> {
  const now = o.now ?? (() => Date.now());
  const lifetimeMs = (o.sessionHours ?? 8) * HOUR_MS;
  const sessions = new Sessions(lifetimeMs, now);
  const limiter = new SignInLimiter(now);
  const secure = !!o.tls || !!o.behindProxy;
  const scheme = secure ? 'https' : 'http';
  let port = o.port;
  const handler = (req: http.IncomingMessage, res: http.ServerResponse) => {
    try {
      // A request naming another host (DNS rebinding: a page elsewhere resolving its name to this address) is refused.
      if (!allowedHosts(o.host, port, o.hostNames ?? [], o.behindProxy).has((req.headers.host ?? '').toLowerCase()))
        return send(res, 421, 'text/plain; charset=utf-8', 'this page answers only to its configured host names');
      route(req, res).catch((e) => failed(res, e));
    } catch (e) {
      failed(res, e);
    }
  };
  const server = o.tls ? https.createServer({ cert: o.tls.cert, key: o.tls.key }, handler) : http.createServer(handler);

  function failed(res: http.ServerResponse, e: unknown): void {
    o.log(`web: ${(e as Error).message}`);
    if (!res.headersSent) send(res, 500, 'text/plain; charset=utf-8', 'internal error');
    else res.end();
  }

  /** A form posted from another origin is refused (the browser says where it comes from). */
  const sameOrigin = (req: http.IncomingMessage) =>
    !req.headers.origin || allowedOrigins(o.host, port, o.hostNames ?? [], scheme, o.behindProxy).has(req.headers.origin.toLowerCase());

  async function route(req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', 'http://localhost');
    // HEAD is GET without the body (Node leaves the body out of a HEAD response).
    const read = req.method === 'GET' || req.method === 'HEAD';
    if (url.pathname === '/signin' && read) return send(res, 200, 'text/html; charset=utf-8', signInPage(await noAccounts()));
    if (url.pathname === '/signin' && req.method === 'POST') return signIn(req, res);
    const token = cookieOf(req, SESSION_COOKIE);
    const session = sessions.get(token);
    if (!session) return read ? redirect(res, '/signin') : send(res, 401, 'text/plain; charset=utf-8', 'sign in first');
    if (url.pathname === '/signout' && req.method === 'POST') return signOut(req, res, token, session);
    const check = /^\/check\/(\d+)(\/report|\/review)?$/.exec(url.pathname);
    if (read && url.pathname === '/') return list(url, res, session);
    if (check && read && !check[2]) return one(Number(check[1]), res, session);
    if (check && read && check[2] === '/report') {
      const html = await o.history.html(Number(check[1]));
      // The stored report is shown framed in its check's page, and nowhere else; with its sign-off once reviewed.
      return html
        ? send(res, 200, 'text/html; charset=utf-8', withSignOff(html, await o.history.reviews(Number(check[1]))), "'self'")
        : send(res, 404, 'text/html; charset=utf-8', notFoundPage('no such check', session));
    }
    if (check && req.method === 'POST' && check[2] === '/review') return review(Number(check[1]), req, res, session);
    send(res, 404, 'text/html; charset=utf-8', notFoundPage(`nothing at ${url.pathname}`, session));
  }

  const noAccounts = async () => (await o.history.users()).length === 0;

  async function signIn(req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
    if (!sameOrigin(req)) return send(res, 403, 'text/plain; charset=utf-8', 'forbidden');
    const form = await readForm(req, res);
    if (!form) return;
    const f = SignInForm.safeParse(Object.fromEntries(form));
    const address = req.socket.remoteAddress ?? '';
    const name = f.success ? f.data.name : '';
    if (limiter.blocked(address, name)) {
      o.log(`web: sign-in refused for ${name || '(no name)'} from ${address}: too many failures`);
      return send(res, 429, 'text/html; charset=utf-8', signInPage(false, 'Too many failed sign-ins: wait a quarter of an hour.'));
    }
    const user = f.success ? await o.history.user(f.data.name) : undefined;
    // A password is checked even for an unknown name, so the time taken does not tell which names exist.
    const ok = await verifyPassword(f.success ? f.data.password : '', user?.passwordHash ?? UNKNOWN_USER_HASH);
    if (!user || !ok) {
      limiter.failed(address, name);
      o.log(`web: failed sign-in for ${name || '(no name)'} from ${address}`);
      return send(res, 401, 'text/html; charset=utf-8', signInPage(await noAccounts(), 'The name or the password is not right.'));
    }
    limiter.succeeded(address, name);
    const started = sessions.start(user.name, user.role);
    o.log(`web: ${user.name} (${user.role}) signed in from ${address}`);
    redirect(res, '/', sessionCookie(started.token, lifetimeMs / 1000, secure));
  }

  async function signOut(req: http.IncomingMessage, res: http.ServerResponse, token: string | undefined, session: Session): Promise<void> {
    const form = await readForm(req, res);
    if (!form) return;
    if (!sameOrigin(req) || form.get('csrf') !== session.csrf) return send(res, 403, 'text/plain; charset=utf-8', 'forbidden');
    sessions.end(token);
    redirect(res, '/signin', sessionCookie('', 0, secure));
  }

  async function list(url: URL, res: http.ServerResponse, session: Session): Promise<void> {
    const raw = Object.fromEntries(url.searchParams);
    const q = ListQuery.parse(raw);
    // A filter that cannot be read is said on the page, never dropped unsaid.
    const ignored = Object.entries(raw)
      .filter(([k, v]) => v !== '' && (q as Record<string, unknown>)[k] === undefined)
      .map(([k, v]) => `${k}=${v}`);
    const since = q.since ?? new Date(now() - 7 * DAY_MS).toISOString().slice(0, 10);
    const all = await o.history.listChecks({ since });
    const machines = [...new Set(all.map((c) => c.machine).filter((m): m is string => !!m))].sort();
    const checks = [];
    for (const c of all.filter((c) => (!q.machine || c.machine === q.machine) && (!q.verdict || c.verdict === q.verdict)))
      checks.push({ ...c, reviews: (await o.history.reviews(c.id)).length });
    const trend: TrendPoint[] = [];
    const topCauses = new Map<number, string>();
    for (const c of checks) {
      const r = await o.history.result(c.id);
      const top = topCause(r);
      if (top) topCauses.set(c.id, top);
      for (const b of r?.fractionGroups.flatMap((g) => g.beams) ?? []) {
        if (b.status !== 'checked' || b.calculation?.doseDeviationPercent === undefined) continue;
        const unit = b.radiationType === 'ELECTRON' ? 'MeV' : 'MV';
        trend.push({
          series: `${c.machine ?? '—'} ${b.nominalEnergy ?? '?'} ${unit} ${techniqueOf(b)}`,
          atMs: Date.parse(c.recordedAt),
          deviationPercent: b.calculation.doseDeviationPercent,
          withinTolerance: b.verdict === 'within tolerance',
          checkId: c.id,
          planLabel: c.planLabel,
        });
      }
    }
    const queue = [];
    for (const c of await o.history.listChecks({ needingReview: true, unreviewed: true, oldestFirst: true }))
      queue.push(chartRoundEntry(c, await o.history.result(c.id), []));
    send(
      res,
      200,
      'text/html; charset=utf-8',
      listPage({
        queue,
        checks: checks.map((c) => ({ ...c, ...(topCauses.has(c.id) ? { topCause: topCauses.get(c.id)! } : {}) })),
        filter: { since, ...(q.machine ? { machine: q.machine } : {}), ...(q.verdict ? { verdict: q.verdict } : {}) },
        machines,
        trend,
        notChecked: await o.history.intakeOutcomes(since),
        ignoredFilters: ignored,
        who: session,
      }),
    );
  }

  async function one(id: number, res: http.ServerResponse, session: Session): Promise<void> {
    const [record] = await o.history.listChecks({ id });
    const result = record ? await o.history.result(id) : undefined;
    if (!record || !result) return send(res, 404, 'text/html; charset=utf-8', notFoundPage('no such check', session));
    send(res, 200, 'text/html; charset=utf-8', checkPage(record, result, await o.history.reviews(id), session));
  }

  async function review(id: number, req: http.IncomingMessage, res: http.ServerResponse, session: Session): Promise<void> {
    // Only the page itself may post, with the sign-in's token; only a physicist records a review.
    if (!sameOrigin(req)) return send(res, 403, 'text/plain; charset=utf-8', 'forbidden');
    const body = await readForm(req, res);
    if (!body) return;
    if (body.get('csrf') !== session.csrf) return send(res, 403, 'text/plain; charset=utf-8', "forbidden: the form is not this sign-in's");
    const form = ReviewForm.safeParse(Object.fromEntries(body));
    if (!form.success) return send(res, 400, 'text/plain; charset=utf-8', form.error.issues.map((i) => i.message).join('; '));
    if (session.role !== 'physicist') return send(res, 403, 'text/plain; charset=utf-8', 'only a physicist records a review');
    if (!(await o.history.listChecks({ id })).length) return send(res, 400, 'text/plain; charset=utf-8', 'no such check');
    await o.history.addReview({
      checkId: id,
      reviewer: session.user,
      reviewerRole: session.role,
      reviewedAt: new Date(now()).toISOString(),
      accepted: form.data.accepted === 'yes',
      comment: form.data.comment,
    });
    o.log(`review of check ${id} by ${session.user}: ${form.data.accepted === 'yes' ? 'accepted' : 'not accepted'}`);
    redirect(res, `/check/${id}`);
  }

  return new Promise((resolvePromise, reject) => {
    server.once('error', reject);
    server.listen(o.port, o.host, () => {
      port = (server.address() as net.AddressInfo).port;
      o.log(`chart-round page on ${o.tls ? 'https' : 'http'}://${o.host}:${port}/`);
      resolvePromise({
        port,
        close: () =>
          new Promise((done) => {
            server.closeAllConnections();
            server.close(() => done());
          }),
      });
    });
  });
}

/** A well-formed hash no password matches (random salt and key), checked for names that have no account. */
const UNKNOWN_USER_HASH = `scrypt$16384$8$1$${Buffer.alloc(16, 7).toString('base64')}$${Buffer.alloc(64, 9).toString('base64')}`;
