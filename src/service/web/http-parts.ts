import type http from 'node:http';

/** The largest form accepted (bytes): a review or a sign-in. */
export const MAX_FORM_BYTES = 8 * 1024;
export const SESSION_COOKIE = 'plumbline_session';

export function send(res: http.ServerResponse, status: number, type: string, body: string, frameAncestors = "'none'"): void {
  res.writeHead(status, {
    'content-type': type,
    'cache-control': 'no-store',
    'x-content-type-options': 'nosniff',
    'content-security-policy':
      `default-src 'none'; style-src 'unsafe-inline'; img-src data:; frame-src 'self'; form-action 'self'; ` + `frame-ancestors ${frameAncestors}`,
  });
  res.end(body);
}

export function redirect(res: http.ServerResponse, to: string, cookie?: string): void {
  res.writeHead(303, { location: to, 'cache-control': 'no-store', ...(cookie ? { 'set-cookie': cookie } : {}) });
  res.end();
}

/** A form body (URL-encoded), or undefined when it is larger than the limit (answered 413, the rest not read). */
export function readForm(req: http.IncomingMessage, res: http.ServerResponse): Promise<URLSearchParams | undefined> {
  return new Promise((done) => {
    const tooLarge = () => {
      res.setHeader('connection', 'close');
      send(res, 413, 'text/plain; charset=utf-8', `a form is at most ${MAX_FORM_BYTES} bytes`);
      done(undefined);
    };
    if (Number(req.headers['content-length'] ?? 0) > MAX_FORM_BYTES) return tooLarge();
    let body = '';
    let over = false;
    req.on('data', (d: Buffer) => {
      if (over) return;
      body += d.toString('utf8');
      if (body.length > MAX_FORM_BYTES) {
        over = true;
        tooLarge();
      }
    });
    req.on('end', () => {
      if (!over) done(new URLSearchParams(body));
    });
  });
}

/** One cookie's value from the request. */
export function cookieOf(req: http.IncomingMessage, name: string): string | undefined {
  for (const part of (req.headers.cookie ?? '').split(';')) {
    const [k, ...v] = part.trim().split('=');
    if (k === name) return v.join('=');
  }
  return undefined;
}

/** The sign-in cookie: never readable by scripts, never sent from another site, Secure when the page is reached over TLS. */
export function sessionCookie(token: string, maxAgeSeconds: number, secure: boolean): string {
  return `${SESSION_COOKIE}=${token}; HttpOnly; SameSite=Strict; Path=/; Max-Age=${Math.max(0, Math.floor(maxAgeSeconds))}${secure ? '; Secure' : ''}`;
}

const LOOPBACK = new Set(['127.0.0.1', '::1', 'localhost']);
export const isLoopback = (host: string): boolean => LOOPBACK.has(host) || host.startsWith('127.');

/**
 * The Host headers the page answers to: its configured host (and, on loopback, the loopback names)
 * with its port; behind a proxy, also its names alone (the proxy's port is the browser's).
 */
export function allowedHosts(host: string, port: number, names: readonly string[], behindProxy = false): Set<string> {
  const hosts = [host, ...names, ...(isLoopback(host) ? ['127.0.0.1', 'localhost', '[::1]'] : [])].map((h) =>
    h.includes(':') && !h.startsWith('[') ? `[${h}]` : h,
  );
  return new Set([...hosts.map((h) => `${h}:${port}`), ...(behindProxy ? hosts : [])].map((h) => h.toLowerCase()));
}

/** The origins a form may be posted from: the page itself, over its scheme (https behind a proxy). */
export const allowedOrigins = (host: string, port: number, names: readonly string[], scheme: 'http' | 'https', behindProxy = false): Set<string> =>
  new Set([...allowedHosts(host, port, names, behindProxy)].map((h) => `${scheme}://${h}`));
