import http from 'node:http';
import type net from 'node:net';
import { z } from 'zod';
import { PlanVerdict } from '../../model/index.js';
import { topCause } from '../history/chart-round.js';
import type { HistoryStore } from '../history/store.js';
import { checkPage, listPage, notFoundPage, type TrendPoint } from './pages.js';

const DAY_MS = 86_400_000;
const MAX_FORM_BYTES = 8 * 1024;

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
  reviewer: z.string().trim().min(1, "give the reviewer's name").max(64),
  accepted: z.enum(['yes', 'no'], { message: 'say whether the check is accepted' }),
  comment: z.string().max(500).default(''),
});

/**
 * The chart-round page on loopback: read-only over the history, except the review form, which adds
 * a review record. Every value from a request is parsed (zod) before use; pages escape everything.
 */
export function startWebServer(o: {
  host: string;
  port: number;
  history: HistoryStore;
  /** Further names the page may be reached by (a DNS name of this machine); the configured host always. */
  hostNames?: readonly string[];
  now?: () => number;
  log: (l: string) => void;
}): Promise<{ port: number; close: () => Promise<void> }> {
  const now = o.now ?? (() => Date.now());
  let port = o.port;
  const server = http.createServer((req, res) => {
    try {
      // A request naming another host (DNS rebinding: a page elsewhere resolving its name to this address) is refused.
      if (!allowedHosts(o.host, port, o.hostNames ?? []).has((req.headers.host ?? '').toLowerCase()))
        return send(res, 421, 'text/plain; charset=utf-8', 'this page answers only to its configured host names');
      route(req, res).catch((e) => failed(res, e));
    } catch (e) {
      failed(res, e);
    }
  });

  function failed(res: http.ServerResponse, e: unknown): void {
    o.log(`web: ${(e as Error).message}`);
    if (!res.headersSent) send(res, 500, 'text/plain; charset=utf-8', 'internal error');
    else res.end();
  }

  async function route(req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
    const url = new URL(req.url ?? '/', 'http://localhost');
    const check = /^\/check\/(\d+)(\/report|\/review)?$/.exec(url.pathname);
    // HEAD is GET without the body (Node leaves the body out of a HEAD response).
    const read = req.method === 'GET' || req.method === 'HEAD';
    if (read && url.pathname === '/') return list(url, res);
    if (check && read && !check[2]) return one(Number(check[1]), res);
    if (check && read && check[2] === '/report') {
      const html = await o.history.html(Number(check[1]));
      // The stored report is shown framed in its check's page, and nowhere else.
      return html
        ? send(res, 200, 'text/html; charset=utf-8', html, "'self'")
        : send(res, 404, 'text/html; charset=utf-8', notFoundPage('no such check'));
    }
    if (check && req.method === 'POST' && check[2] === '/review') return review(Number(check[1]), req, res);
    send(res, 404, 'text/html; charset=utf-8', notFoundPage(`nothing at ${url.pathname}`));
  }

  async function list(url: URL, res: http.ServerResponse): Promise<void> {
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
          series: `${c.machine ?? '—'} ${b.nominalEnergy ?? '?'} ${unit}`,
          atMs: Date.parse(c.recordedAt),
          deviationPercent: b.calculation.doseDeviationPercent,
        });
      }
    }
    send(
      res,
      200,
      'text/html; charset=utf-8',
      listPage(
        checks.map((c) => ({ ...c, ...(topCauses.has(c.id) ? { topCause: topCauses.get(c.id)! } : {}) })),
        { since, ...(q.machine ? { machine: q.machine } : {}), ...(q.verdict ? { verdict: q.verdict } : {}) },
        machines,
        trend,
        await o.history.intakeOutcomes(since),
        ignored,
      ),
    );
  }

  async function one(id: number, res: http.ServerResponse): Promise<void> {
    const [record] = await o.history.listChecks({ id });
    const result = record ? await o.history.result(id) : undefined;
    if (!record || !result) return send(res, 404, 'text/html; charset=utf-8', notFoundPage('no such check'));
    send(res, 200, 'text/html; charset=utf-8', checkPage(record, result, await o.history.reviews(id)));
  }

  async function review(id: number, req: http.IncomingMessage, res: http.ServerResponse): Promise<void> {
    // Only the page itself may post: a form from another origin is refused.
    const origin = req.headers.origin;
    if (origin && !allowedOrigins(o.host, port, o.hostNames ?? []).has(origin.toLowerCase()))
      return send(res, 403, 'text/plain; charset=utf-8', 'forbidden');
    if (Number(req.headers['content-length'] ?? 0) > MAX_FORM_BYTES) return tooLarge(res);
    let body = '';
    let over = false;
    req.on('data', (d: Buffer) => {
      if (over) return;
      body += d.toString('utf8');
      if (body.length > MAX_FORM_BYTES) {
        over = true;
        tooLarge(res);
      }
    });
    req.on('end', () => {
      if (!over) recordReview(id, body, res).catch((e) => failed(res, e));
    });
  }

  async function recordReview(id: number, body: string, res: http.ServerResponse): Promise<void> {
    const form = ReviewForm.safeParse(Object.fromEntries(new URLSearchParams(body)));
    if (!form.success || !(await o.history.listChecks({ id })).length) {
      return send(res, 400, 'text/plain; charset=utf-8', form.success ? 'no such check' : form.error.issues.map((i) => i.message).join('; '));
    }
    await o.history.addReview({
      checkId: id,
      reviewer: form.data.reviewer,
      reviewedAt: new Date(now()).toISOString(),
      accepted: form.data.accepted === 'yes',
      comment: form.data.comment,
    });
    o.log(`review of check ${id} by ${form.data.reviewer}: ${form.data.accepted === 'yes' ? 'accepted' : 'not accepted'}`);
    res.writeHead(303, { location: `/check/${id}` });
    res.end();
  }

  return new Promise((resolvePromise, reject) => {
    server.once('error', reject);
    server.listen(o.port, o.host, () => {
      port = (server.address() as net.AddressInfo).port;
      o.log(`chart-round page on http://${o.host}:${port}/`);
      if (!isLoopback(o.host))
        o.log(`WARNING: the page listens on ${o.host}, beyond this machine, without TLS or sign-in: anyone who reaches it can read and review`);
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

function send(res: http.ServerResponse, status: number, type: string, body: string, frameAncestors = "'none'"): void {
  res.writeHead(status, {
    'content-type': type,
    'cache-control': 'no-store',
    'x-content-type-options': 'nosniff',
    'content-security-policy':
      `default-src 'none'; style-src 'unsafe-inline'; img-src data:; frame-src 'self'; form-action 'self'; ` + `frame-ancestors ${frameAncestors}`,
  });
  res.end(body);
}

/** A review body past the limit: answered 413, the rest of it not read. */
function tooLarge(res: http.ServerResponse): void {
  res.setHeader('connection', 'close');
  send(res, 413, 'text/plain; charset=utf-8', `a review is at most ${MAX_FORM_BYTES} bytes`);
}

const LOOPBACK = new Set(['127.0.0.1', '::1', 'localhost']);
const isLoopback = (host: string): boolean => LOOPBACK.has(host) || host.startsWith('127.');

/** The Host headers the page answers to: its configured host (and, on loopback, the loopback names) with its port. */
function allowedHosts(host: string, port: number, names: readonly string[]): Set<string> {
  const hosts = [host, ...names, ...(isLoopback(host) ? ['127.0.0.1', 'localhost', '[::1]'] : [])];
  return new Set(hosts.map((h) => `${h.includes(':') && !h.startsWith('[') ? `[${h}]` : h}:${port}`.toLowerCase()));
}

const allowedOrigins = (host: string, port: number, names: readonly string[]): Set<string> =>
  new Set([...allowedHosts(host, port, names)].map((h) => `http://${h}`));

/** The largest cause explaining a check's beams, in words, if the result explains any. */
