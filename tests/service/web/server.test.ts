/**
 * The chart-round page in a real browser: Debian's headless Chromium driven by playwright-core (no
 * browser download), over a history filled by the intake pipeline from the demo clinic. Signed in:
 * a physicist reviews under their own name, a viewer reads, every form carries its sign-in's token.
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type Browser, chromium, type Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_POLICY } from '../../../src/check/index.js';
import { loadBeamData } from '../../../src/run/index.js';
import { ServiceConfig } from '../../../src/service/config.js';
import { SqliteHistoryStore } from '../../../src/service/history/sqlite-store.js';
import { processInbox } from '../../../src/service/pipeline.js';
import { controlLimits } from '../../../src/service/web/control-limits.js';
import { hashPassword } from '../../../src/service/web/passwords.js';
import { startWebServer } from '../../../src/service/web/server.js';
import { FAILURE_WINDOW_MS, MAX_FAILURES } from '../../../src/service/web/sessions.js';
import { chromiumPath } from '../../helpers/browser.js';
import { DEMO_MANIFEST, manifestPath } from '../../helpers/machines.js';

const root = mkdtempSync(join(tmpdir(), 'plumbline-web-'));
const config = ServiceConfig.parse({
  format: 'plumbline.service',
  formatVersion: 1,
  folders: { inbox: join(root, 'inbox'), archive: join(root, 'archive'), refused: join(root, 'refused') },
  history: { kind: 'sqlite', file: join(root, 'history.sqlite') },
  beamData: [DEMO_MANIFEST],
  settleSeconds: 0,
});
const PHYSICIST = { name: 'Physicist Demo', password: 'a long demo passphrase' };
const VIEWER = { name: 'Viewer Demo', password: 'another demo passphrase' };
let history: SqliteHistoryStore;
let browser: Browser;
let base = '';
let close: () => Promise<void>;
let clock = Date.now();

beforeAll(async () => {
  const m = loadBeamData(DEMO_MANIFEST);
  if (!m.ok) throw new Error('demo');
  history = new SqliteHistoryStore(join(root, 'history.sqlite'));
  mkdirSync(config.folders.inbox, { recursive: true });
  for (const f of ['brain-laterals.dcm', 'breast-tangents.dcm', 'spine-ssd.dcm', 'lung-mlc.dcm'])
    copyFileSync(manifestPath(`fixtures/demo/clinic/${f}`), join(config.folders.inbox, f));
  // The brain laterals again as another plan whose second beam's MU was typed 10 % high (109 → 119.9), changed by dcmtk's dcmodify.
  const typo = join(config.folders.inbox, 'brain-typo.dcm');
  copyFileSync(manifestPath('fixtures/demo/clinic/brain-laterals.dcm'), typo);
  const modified = spawnSync('dcmodify', [
    '-nb',
    '-m',
    '(0008,0018)=2.25.4242',
    '-m',
    '(300a,0002)=BRAIN LATS MU',
    '-m',
    '(300a,0070)[0].(300c,0004)[1].(300a,0086)=119.9',
    typo,
  ]);
  if (modified.status !== 0) throw new Error(`dcmodify: ${modified.stderr}`);
  await processInbox({ config, machines: [m.value], policy: DEFAULT_POLICY, history, log: () => {}, now: () => Date.now() + 1000 });
  const createdAt = new Date().toISOString();
  await history.addUser({ name: PHYSICIST.name, role: 'physicist', passwordHash: await hashPassword(PHYSICIST.password), createdAt });
  await history.addUser({ name: VIEWER.name, role: 'viewer', passwordHash: await hashPassword(VIEWER.password), createdAt });
  const web = await startWebServer({ host: '127.0.0.1', port: 0, history, log: () => {}, now: () => clock });
  base = `http://127.0.0.1:${web.port}`;
  close = web.close;
  // As root (CI containers) Chromium needs --no-sandbox.
  browser = await chromium.launch({ executablePath: chromiumPath(), args: process.getuid?.() === 0 ? ['--no-sandbox'] : [] });
}, 60_000);
afterAll(async () => {
  await browser?.close();
  await close?.();
  await history?.close();
});

/** A browser page signed in as the user (its own context: its own cookies). */
async function signedIn(user: { name: string; password: string }): Promise<Page> {
  const page = await (await browser.newContext({ viewport: { width: 1280, height: 900 } })).newPage();
  await page.goto(`${base}/`);
  expect(page.url()).toBe(`${base}/signin`);
  await page.fill('input[name="name"]', user.name);
  await page.fill('input[name="password"]', user.password);
  await page.click('#signin button[type="submit"]');
  await expect.poll(() => page.url()).toBe(`${base}/`);
  return page;
}

/** A sign-in by fetch: its cookie and the CSRF token its forms carry. */
async function session(user: { name: string; password: string }): Promise<{ cookie: string; csrf: string; setCookie: string }> {
  const r = await fetch(`${base}/signin`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams(user).toString(),
  });
  expect(r.status).toBe(303);
  const setCookie = r.headers.get('set-cookie')!;
  const cookie = setCookie.split(';')[0]!;
  const home = await (await fetch(`${base}/`, { headers: { cookie } })).text();
  const csrf = /name="csrf" value="([^"]+)"/.exec(home)![1]!;
  return { cookie, csrf, setCookie };
}

const post = (path: string, body: string, headers: Record<string, string> = {}) =>
  fetch(`${base}${path}`, { method: 'POST', redirect: 'manual', headers: { 'content-type': 'application/x-www-form-urlencoded', ...headers }, body });

describe('the chart-round page', () => {
  it('asks for a sign-in before anything: pages lead to it, a review unsigned is refused', async () => {
    const r = await fetch(`${base}/`, { redirect: 'manual' });
    expect(r.status).toBe(303);
    expect(r.headers.get('location')).toBe('/signin');
    const id = (await history.listChecks())[0]!.id;
    expect((await post(`/check/${id}/review`, 'accepted=yes')).status).toBe(401);
    expect((await fetch(`${base}/check/${id}/report`, { redirect: 'manual' })).status).toBe(303);
  });

  it('signs in with a cookie scripts cannot read and other sites never send, for the hours set', async () => {
    const { setCookie } = await session(VIEWER);
    expect(setCookie).toMatch(/^plumbline_session=[\w-]{43}; HttpOnly; SameSite=Strict; Path=\/; Max-Age=28800$/);
    const wrong = await post('/signin', new URLSearchParams({ name: VIEWER.name, password: 'not it at all' }).toString());
    expect(wrong.status).toBe(401);
    expect(await wrong.text()).toMatch(/The name or the password is not right/);
  });

  it('puts first the checks waiting for a review: beyond the action level, needing review or not fully verified, oldest first', async () => {
    const page = await signedIn(VIEWER);
    const rows = page.locator('#queue tbody tr');
    expect(await rows.count()).toBe(2);
    const texts = (await rows.allTextContents()).sort();
    expect(texts[0]).toMatch(/BRAIN LATS MU.*beyond action level.*beam 2: \+9\.4 %.*beam 2: MU as typed\?/); // 1.1 × (1 − 0.54 %) − 1
    expect(texts[1]).toMatch(/L BREAST TG.*beyond action level.*beam 2: \+10\.\d %/);
    const ids = await rows.evaluateAll((trs) => trs.map((tr) => Number(tr.getAttribute('data-check'))));
    const recorded = await history.listChecks({ oldestFirst: true });
    expect(ids).toEqual(recorded.filter((c) => ids.includes(c.id)).map((c) => c.id));
    await page.close();
  });

  it("lists the week's plans with verdict counts and filters them by verdict", async () => {
    const page = await signedIn(VIEWER);
    expect(await page.locator('#who').textContent()).toBe('Viewer Demo (viewer)');
    expect(await page.locator('#checks tbody tr').count()).toBe(5);
    expect(await page.locator('[data-verdict="beyond action level"] b').textContent()).toBe('2');
    await page.selectOption('select[name="verdict"]', 'beyond action level');
    await page.click('form.filters button[type="submit"]');
    expect(await page.locator('#checks tbody tr').count()).toBe(2);
    expect((await page.locator('#checks tbody tr td a').allTextContents()).sort()).toEqual(['BRAIN LATS MU', 'L BREAST TG']);
    // The likely cause of its deviation beside it: the lateral tangent's MU as typed (planted 10 % high in the demo).
    expect(await page.locator('#checks tr:has-text("L BREAST TG") td.cause').textContent()).toMatch(/^beam 2: MU as typed\? \+11\.\d %$/);
    expect(await page.locator('#caution').textContent()).toMatch(/an aid to, never a replacement for/);
    await page.close();
  });

  it('trends each machine, energy and technique; the limits come from the beams within tolerance, a mis-typed MU marked outside them', async () => {
    const page = await signedIn(VIEWER);
    const series = await page.locator('figure.trend').evaluateAll((fs) => fs.map((f) => f.getAttribute('data-series')));
    expect(series).toEqual(['NG_LINAC1 6 MV MLC', 'NG_LINAC1 6 MV open', 'NG_LINAC1 6 MV wedged']);
    const open = page.locator('figure.trend[data-series="NG_LINAC1 6 MV open"]');
    expect(await open.locator('circle.point').count()).toBe(5); // 2 laterals, 2 laterals with the typo, 1 spine
    expect(await open.locator('line.limit').count()).toBe(4); // 0 %, mean, +3σ, −3σ
    // The caption's limits are those of the 4 beams within tolerance (sample standard deviation), not of all 5.
    const results = await Promise.all((await history.listChecks()).map((c) => history.result(c.id)));
    const beams = results.flatMap((r) => r!.fractionGroups.flatMap((g) => g.beams)).filter((b) => !b.calculation?.wedgeId && b.nominalEnergy === 6);
    const openBeams = beams.filter((b) => !b.calculation?.approximations?.some((n) => n.code.startsWith('leaf-end')));
    const within = openBeams.filter((b) => b.verdict === 'within tolerance').map((b) => b.calculation!.doseDeviationPercent!);
    expect(within).toHaveLength(4);
    const lim = controlLimits(within)!;
    const all = controlLimits(openBeams.map((b) => b.calculation!.doseDeviationPercent!))!;
    expect(all.upper - all.lower).toBeGreaterThan(3 * (lim.upper - lim.lower));
    expect(await open.locator('figcaption').textContent()).toContain(`limits ${lim.lower.toFixed(2)} % to ${lim.upper.toFixed(2)} %`);
    expect(await open.locator('circle.point.outside').count()).toBe(1);
    expect(await open.locator('circle.point.outside title').textContent()).toMatch(/^BRAIN LATS MU, .*: 9\.4\d %$/);
    expect(await open.locator('table.outside a').textContent()).toBe('BRAIN LATS MU');
    // A time axis: the first and last days of the points.
    expect(await open.locator('text.tick').count()).toBe(3);
    await page.close();
  });

  it('fits 1280 pixels: nothing on the page is wider than the window', async () => {
    const page = await signedIn(VIEWER);
    const overflow = await page.evaluate(() => {
      const wide = [...document.querySelectorAll('body *')].filter((e) => e.getBoundingClientRect().right > window.innerWidth + 1);
      return { scroll: document.documentElement.scrollWidth, wide: wide.map((e) => e.tagName + (e.id ? `#${e.id}` : '')).slice(0, 5) };
    });
    expect(overflow).toEqual({ scroll: 1280, wide: [] });
    const shot = await page.screenshot({ fullPage: true });
    expect(shot.length).toBeGreaterThan(10_000);
    await page.close();
  });

  it("a physicist opens a plan's report (the same HTML as check --html) and reviews it under their own name, a new record", async () => {
    const page = await signedIn(PHYSICIST);
    await page.click('text=L BREAST TG');
    await expect.poll(() => page.url()).toMatch(/\/check\/\d+$/);
    const report = page.frameLocator('iframe[title="report"]');
    await expect.poll(async () => (await report.locator('body').textContent()) ?? '').toMatch(/L BREAST TG[\s\S]*an aid to, never a replacement for/);
    expect(await page.locator('input[name="reviewer"]').count()).toBe(0);
    await page.check('input[name="accepted"][value="no"]');
    await page.fill('input[name="comment"]', 'lateral MU mistyped: replan');
    await page.click('#review button[type="submit"]');
    await expect
      .poll(async () => (await page.locator('#reviews').textContent()) ?? '')
      .toMatch(/Physicist Demo: not accepted — lateral MU mistyped: replan/);
    const id = Number(/\/check\/(\d+)/.exec(page.url())![1]);
    expect((await history.reviews(id)).map((r) => r.reviewer)).toEqual(['Physicist Demo']);
    await page.goto(`${base}/`);
    expect(await page.locator(`tr[data-check="${id}"] td`).last().textContent()).toBe('1');
    await page.close();
  });

  it('the stored report carries the sign-off once reviewed, and printed, the patient and the page number on every page', async () => {
    const id = (await history.listChecks()).find((c) => c.planLabel === 'L BREAST TG')!.id;
    const page = await signedIn(PHYSICIST);
    // The check's page and its stored report word the result the same.
    await page.goto(`${base}/check/${id}`);
    const title = await page.locator('h1').textContent();
    await page.goto(`${base}/check/${id}/report`);
    expect(title).toBe('L BREAST TG: beyond action level');
    expect(await page.locator('section.plan h2').first().textContent()).toMatch(/— beyond action level$/);
    const signOff = page.locator('#sign-off tbody tr');
    expect(await signOff.count()).toBe(1);
    expect((await signOff.locator('td').allTextContents()).slice(0, 2)).toEqual(['Physicist Demo', 'physicist']);
    // Printed by Chromium, read back by poppler's pdftotext: each page names the patient and its number of the whole.
    const pdf = join(root, 'report.pdf');
    await page.pdf({ path: pdf, format: 'A4' });
    await page.close();
    const text = spawnSync('pdftotext', ['-layout', pdf, '-'], { encoding: 'utf8' });
    expect(text.status, text.stderr).toBe(0);
    const pages = text.stdout.split('\f').filter((t) => t.trim());
    expect(pages.length).toBeGreaterThan(1);
    const patientId = (await history.listChecks({ id }))[0]!.patientId!;
    pages.forEach((t, k) => {
      expect(t).toMatch(new RegExp(`Patient [^\\n]+, ID ${patientId}`));
      expect(t).toContain(`page ${k + 1} of ${pages.length}`);
    });
    expect(pages.at(-1)).toMatch(/Sign-off[\s\S]*Physicist Demo\s+physicist/);
  });

  it('a viewer reads but cannot review: no form on the page, and a review posted with their token is refused', async () => {
    const page = await signedIn(VIEWER);
    await page.click('text=BRAIN LATS');
    await expect.poll(() => page.url()).toMatch(/\/check\/\d+$/);
    expect(await page.locator('#review').count()).toBe(0);
    expect(await page.locator('#read-only').textContent()).toMatch(/reviews are recorded by physicists/);
    const id = Number(/\/check\/(\d+)/.exec(page.url())![1]);
    await page.close();
    const v = await session(VIEWER);
    const r = await post(`/check/${id}/review`, `csrf=${encodeURIComponent(v.csrf)}&accepted=yes`, { cookie: v.cookie });
    expect(r.status).toBe(403);
    expect(await history.reviews(id)).toHaveLength(0);
  });

  it("refuses a physicist's review without the sign-in's token, with another's, or from another origin", async () => {
    const id = (await history.listChecks()).find((c) => c.planLabel === 'BRAIN LATS')!.id;
    const p = await session(PHYSICIST);
    const other = await session(PHYSICIST);
    expect((await post(`/check/${id}/review`, 'accepted=yes', { cookie: p.cookie })).status).toBe(403);
    expect((await post(`/check/${id}/review`, `csrf=${encodeURIComponent(other.csrf)}&accepted=yes`, { cookie: p.cookie })).status).toBe(403);
    const foreign = await post(`/check/${id}/review`, `csrf=${encodeURIComponent(p.csrf)}&accepted=yes`, {
      cookie: p.cookie,
      origin: 'http://elsewhere.example',
    });
    expect(foreign.status).toBe(403);
    expect(await history.reviews(id)).toHaveLength(0);
    // With its own token: recorded.
    expect((await post(`/check/${id}/review`, `csrf=${encodeURIComponent(p.csrf)}&accepted=yes`, { cookie: p.cookie })).status).toBe(303);
    expect((await history.reviews(id)).map((r) => [r.reviewer, r.accepted])).toEqual([['Physicist Demo', true]]);
  });

  /** A raw request, so the Host header can be set as a rebinding page would send it (fetch fixes it). */
  const raw = (method: string, path: string, headers: Record<string, string>, body = ''): Promise<{ status: number; text: string }> =>
    new Promise((done, fail) => {
      const req = httpRequest(`${base}${path}`, { method, headers }, (res) => {
        let text = '';
        res.on('data', (d) => (text += d));
        res.on('end', () => done({ status: res.statusCode ?? 0, text }));
      });
      req.on('error', fail);
      req.end(body);
    });

  it('answers only to its own host names: a DNS-rebinding request (another Host) reads nothing and reviews nothing', async () => {
    const id = (await history.listChecks())[0]!.id;
    const before = (await history.reviews(id)).length;
    const p = await session(PHYSICIST);
    expect((await raw('GET', '/', { host: 'attacker.example:80', cookie: p.cookie })).status).toBe(421);
    const attempt = await raw(
      'POST',
      `/check/${id}/review`,
      { host: 'attacker.example', origin: 'http://attacker.example', 'content-type': 'application/x-www-form-urlencoded', cookie: p.cookie },
      `csrf=${encodeURIComponent(p.csrf)}&accepted=yes`,
    );
    expect(attempt.status).toBe(421);
    expect(await history.reviews(id)).toHaveLength(before);
    expect((await raw('GET', '/', { host: new URL(base).host, cookie: p.cookie })).status).toBe(200);
  });

  it('forbids framing by other pages, answers HEAD, refuses an oversized review with 413, and says which filters it ignored', async () => {
    const p = await session(PHYSICIST);
    const home = await fetch(`${base}/`, { headers: { cookie: p.cookie } });
    expect(home.headers.get('content-security-policy')).toMatch(/frame-ancestors 'none'/);
    expect((await fetch(`${base}/`, { method: 'HEAD', headers: { cookie: p.cookie } })).status).toBe(200);
    const id = (await history.listChecks())[0]!.id;
    const big = await post(`/check/${id}/review`, `csrf=${p.csrf}&accepted=yes&comment=${'a'.repeat(20_000)}`, { cookie: p.cookie });
    expect(big.status).toBe(413);
    const filtered = await (await fetch(`${base}/?verdict=maybe&since=yesterday`, { headers: { cookie: p.cookie } })).text();
    expect(filtered).toMatch(/Not understood, so not applied: verdict=maybe, since=yesterday/);
  });

  it('signing out ends the sign-in; a sign-in expires after its hours', async () => {
    const p = await session(VIEWER);
    expect((await post('/signout', `csrf=${encodeURIComponent(p.csrf)}`, { cookie: p.cookie })).status).toBe(303);
    expect((await fetch(`${base}/`, { headers: { cookie: p.cookie }, redirect: 'manual' })).status).toBe(303);
    const q = await session(VIEWER);
    clock += 8 * 3_600_000 + 1;
    expect((await fetch(`${base}/`, { headers: { cookie: q.cookie }, redirect: 'manual' })).status).toBe(303);
  });

  it(`limits sign-in attempts: after ${MAX_FAILURES} failures even the right password is refused, until the window has passed`, async () => {
    for (let i = 0; i < MAX_FAILURES; i++)
      expect((await post('/signin', new URLSearchParams({ name: PHYSICIST.name, password: `wrong ${i}` }).toString())).status).toBe(401);
    expect((await post('/signin', new URLSearchParams(PHYSICIST).toString())).status).toBe(429);
    clock += FAILURE_WINDOW_MS + 1;
    expect((await post('/signin', new URLSearchParams(PHYSICIST).toString())).status).toBe(303);
  });
});
