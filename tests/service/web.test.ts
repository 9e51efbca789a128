/**
 * The chart-round page in a real browser: Debian's headless Chromium driven by playwright-core (no
 * browser download), over a history filled by the intake pipeline from the demo clinic.
 */
import { copyFileSync, mkdirSync, mkdtempSync } from 'node:fs';
import { request as httpRequest } from 'node:http';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { type Browser, chromium } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { loadBeamData } from '../../src/run/index.js';
import { DEFAULT_POLICY } from '../../src/check/index.js';
import { ServiceConfig } from '../../src/service/config.js';
import { SqliteHistoryStore } from '../../src/service/history/sqlite-store.js';
import { processInbox } from '../../src/service/pipeline.js';
import { controlLimits } from '../../src/service/web/control-limits.js';
import { startWebServer } from '../../src/service/web/server.js';
import { chromiumPath } from '../helpers/browser.js';
import { DEMO_MANIFEST, manifestPath } from '../helpers/machines.js';

const root = mkdtempSync(join(tmpdir(), 'plumbline-web-'));
const config = ServiceConfig.parse({
  format: 'plumbline.service',
  formatVersion: 1,
  folders: { inbox: join(root, 'inbox'), archive: join(root, 'archive'), refused: join(root, 'refused') },
  history: { kind: 'sqlite', file: join(root, 'history.sqlite') },
  beamData: [DEMO_MANIFEST],
  settleSeconds: 0,
});
let history: SqliteHistoryStore;
let browser: Browser;
let base = '';
let close: () => Promise<void>;

beforeAll(async () => {
  const m = loadBeamData(DEMO_MANIFEST);
  if (!m.ok) throw new Error('demo');
  history = new SqliteHistoryStore(join(root, 'history.sqlite'));
  mkdirSync(config.folders.inbox, { recursive: true });
  for (const f of ['brain-laterals.dcm', 'breast-tangents.dcm', 'spine-ssd.dcm', 'lung-mlc.dcm'])
    copyFileSync(manifestPath(`fixtures/demo/clinic/${f}`), join(config.folders.inbox, f));
  await processInbox({ config, machines: [m.value], policy: DEFAULT_POLICY, history, log: () => {}, now: () => Date.now() + 1000 });
  const web = await startWebServer({ host: '127.0.0.1', port: 0, history, log: () => {} });
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

describe('the chart-round page', () => {
  it("lists the week's plans with verdict counts and filters them by verdict", async () => {
    const page = await browser.newPage();
    await page.goto(`${base}/`);
    expect(await page.locator('#checks tbody tr').count()).toBe(4);
    expect(await page.locator('[data-verdict="beyond action level"] b').textContent()).toBe('1');
    await page.selectOption('select[name="verdict"]', 'beyond action level');
    await page.click('button[type="submit"]');
    expect(await page.locator('#checks tbody tr').count()).toBe(1);
    expect(await page.locator('#checks tbody tr td a').textContent()).toBe('L BREAST TG');
    // The likely cause of its deviation beside it: the lateral tangent's MU as typed (planted 10 % high in the demo).
    expect(await page.locator('#checks tbody tr td.cause').textContent()).toMatch(/^beam 2: MU as typed\? \+11\.\d %$/);
    expect(await page.locator('#caution').textContent()).toMatch(/an aid to, never a replacement for/);
    await page.close();
  });

  it('shows a trend per machine and energy with the mean and ±3σ control limits of its points', async () => {
    const page = await browser.newPage();
    await page.goto(`${base}/`);
    const six = page.locator('figure.trend[data-series="NG_LINAC1 6 MV"]');
    expect(await six.locator('circle.point').count()).toBe(6); // 2 laterals + 2 tangents + 1 spine + 1 MLC field
    expect(await six.locator('line.limit').count()).toBe(4); // 0 %, mean, +3σ, −3σ
    // The caption's limits are those of the beams' deviations (sample standard deviation).
    const results = await Promise.all((await history.listChecks()).map((c) => history.result(c.id)));
    const devs = results.flatMap((r) => r!.fractionGroups.flatMap((g) => g.beams)).map((b) => b.calculation!.doseDeviationPercent!);
    const lim = controlLimits(devs)!;
    expect(await six.locator('figcaption').textContent()).toContain(`limits ${lim.lower.toFixed(2)} % to ${lim.upper.toFixed(2)} %`);
    await page.close();
  });

  it("opens a plan's report (the same HTML as check --html) and adds a review as a new record", async () => {
    const page = await browser.newPage();
    await page.goto(`${base}/`);
    await page.click('text=L BREAST TG');
    await expect.poll(() => page.url()).toMatch(/\/check\/\d+$/);
    const report = page.frameLocator('iframe[title="report"]');
    await expect.poll(async () => (await report.locator('body').textContent()) ?? '').toMatch(/L BREAST TG[\s\S]*an aid to, never a replacement for/);
    await page.fill('input[name="reviewer"]', 'Physicist Demo');
    await page.check('input[name="accepted"][value="no"]');
    await page.fill('input[name="comment"]', 'lateral MU mistyped: replan');
    await page.click('#review button[type="submit"]');
    await expect
      .poll(async () => (await page.locator('#reviews').textContent()) ?? '')
      .toMatch(/Physicist Demo: not accepted — lateral MU mistyped: replan/);
    const id = Number(/\/check\/(\d+)/.exec(page.url())![1]);
    expect(await history.reviews(id)).toHaveLength(1);
    await page.goto(`${base}/`);
    expect(await page.locator(`tr[data-check="${id}"] td`).last().textContent()).toBe('1');
    await page.close();
  });

  it('refuses a review posted from another origin, and a review without a reviewer', async () => {
    const id = (await history.listChecks())[0]!.id;
    const foreign = await fetch(`${base}/check/${id}/review`, {
      method: 'POST',
      headers: { origin: 'http://elsewhere.example', 'content-type': 'application/x-www-form-urlencoded' },
      body: 'reviewer=x&accepted=yes',
    });
    expect(foreign.status).toBe(403);
    const empty = await fetch(`${base}/check/${id}/review`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: 'reviewer=&accepted=yes',
    });
    expect(empty.status).toBe(400);
    expect(await history.reviews(id)).toHaveLength(0);
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
    expect((await raw('GET', '/', { host: 'attacker.example:80' })).status).toBe(421);
    const post = await raw(
      'POST',
      `/check/${id}/review`,
      { host: 'attacker.example', origin: 'http://attacker.example', 'content-type': 'application/x-www-form-urlencoded' },
      'reviewer=x&accepted=yes',
    );
    expect(post.status).toBe(421);
    expect(await history.reviews(id)).toHaveLength(0);
    expect((await raw('GET', '/', { host: new URL(base).host })).status).toBe(200);
  });

  it('forbids framing by other pages, answers HEAD, refuses an oversized review with 413, and says which filters it ignored', async () => {
    const page = await fetch(`${base}/`);
    expect(page.headers.get('content-security-policy')).toMatch(/frame-ancestors 'none'/);
    expect((await fetch(`${base}/`, { method: 'HEAD' })).status).toBe(200);
    const id = (await history.listChecks())[0]!.id;
    const big = await fetch(`${base}/check/${id}/review`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: `reviewer=x&accepted=yes&comment=${'a'.repeat(20_000)}`,
    });
    expect(big.status).toBe(413);
    const filtered = await (await fetch(`${base}/?verdict=maybe&since=yesterday`)).text();
    expect(filtered).toMatch(/Not understood, so not applied: verdict=maybe, since=yesterday/);
  });
});
