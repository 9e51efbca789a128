/**
 * The page and `plumbline history` on the PostgreSQL history (a throwaway server): the same
 * pipeline records the demo plans there, a physicist signs in and reviews, and the command line
 * lists and exports what the page shows.
 */
import { spawnSync } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DEFAULT_POLICY } from '../../src/check/index.js';
import { loadBeamData } from '../../src/run/index.js';
import { ServiceConfig } from '../../src/service/config.js';
import { PostgresHistoryStore } from '../../src/service/history/postgres-store.js';
import { processInbox } from '../../src/service/pipeline.js';
import { hashPassword } from '../../src/service/web/passwords.js';
import { startWebServer } from '../../src/service/web/server.js';
import { DEMO_MANIFEST, manifestPath } from '../helpers/machines.js';
import { startThrowawayPostgres, type ThrowawayPostgres } from '../helpers/postgres.js';

const ROOT = fileURLToPath(new URL('../../', import.meta.url));
let server: ThrowawayPostgres;
let store: PostgresHistoryStore;
let url = '';
let base = '';
let close: () => Promise<void> = async () => undefined;
const root = mkdtempSync(join(tmpdir(), 'plumbline-web-pg-'));

beforeAll(async () => {
  server = startThrowawayPostgres();
  url = await server.newDatabase('page');
  store = await PostgresHistoryStore.open({ connectionString: url }, url);
  const config = ServiceConfig.parse({
    format: 'plumbline.service',
    formatVersion: 1,
    folders: { inbox: join(root, 'inbox'), archive: join(root, 'archive'), refused: join(root, 'refused') },
    history: { kind: 'postgres', url },
    beamData: [DEMO_MANIFEST],
    settleSeconds: 0,
  });
  mkdirSync(config.folders.inbox, { recursive: true });
  for (const f of ['brain-laterals.dcm', 'breast-tangents.dcm'])
    copyFileSync(manifestPath(`fixtures/demo/clinic/${f}`), join(config.folders.inbox, f));
  const m = loadBeamData(DEMO_MANIFEST);
  if (!m.ok) throw new Error('demo');
  await processInbox({ config, machines: [m.value], policy: DEFAULT_POLICY, history: store, log: () => {}, now: () => Date.now() + 1000 });
  await store.addUser({
    name: 'Physicist P',
    role: 'physicist',
    passwordHash: await hashPassword('a long demo passphrase'),
    createdAt: new Date().toISOString(),
  });
  const web = await startWebServer({ host: '127.0.0.1', port: 0, history: store, log: () => {} });
  base = `http://127.0.0.1:${web.port}`;
  close = web.close;
  writeFileSync(
    join(root, 'service.json'),
    JSON.stringify({
      format: 'plumbline.service',
      formatVersion: 1,
      folders: { inbox: 'i', archive: 'a', refused: 'r' },
      history: { kind: 'postgres', url },
      beamData: ['demo'],
    }),
  );
}, 60_000);
afterAll(async () => {
  await close();
  await store?.close();
  server?.stop();
});

describe('the page and the command line on PostgreSQL', () => {
  it('a physicist signs in, sees the queue and the plans, and reviews under their own name', async () => {
    const signIn = await fetch(`${base}/signin`, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ name: 'Physicist P', password: 'a long demo passphrase' }).toString(),
    });
    expect(signIn.status).toBe(303);
    const cookie = signIn.headers.get('set-cookie')!.split(';')[0]!;
    const home = await (await fetch(`${base}/`, { headers: { cookie } })).text();
    expect(home).toMatch(/<table id="queue">[\s\S]*L BREAST TG[\s\S]*<\/table>/);
    expect(home).toMatch(/BRAIN LATS/);
    const csrf = /name="csrf" value="([^"]+)"/.exec(home)![1]!;
    const id = (await store.listChecks()).find((c) => c.planLabel === 'L BREAST TG')!.id;
    const r = await fetch(`${base}/check/${id}/review`, {
      method: 'POST',
      redirect: 'manual',
      headers: { cookie, 'content-type': 'application/x-www-form-urlencoded' },
      body: `csrf=${encodeURIComponent(csrf)}&accepted=no&comment=replan`,
    });
    expect(r.status).toBe(303);
    expect((await store.reviews(id)).map((x) => [x.reviewer, x.reviewerRole, x.accepted])).toEqual([['Physicist P', 'physicist', false]]);
    expect(await (await fetch(`${base}/check/${id}/report`, { headers: { cookie } })).text()).toMatch(/id="sign-off"[\s\S]*Physicist P/);
  });

  it('plumbline history lists the same checks and exports them as CSV', () => {
    const cli = (...args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'src/cli/bin.ts', ...args], { cwd: ROOT, encoding: 'utf8' });
    const list = cli('history', '--config', join(root, 'service.json'));
    expect(list.status, list.stderr).toBe(0);
    expect(list.stdout).toMatch(/2 check\(s\) in postgresql:\/\//);
    expect(list.stdout).toMatch(/L BREAST TG .* beyond action level .* 1\s*$/m);
    const csv = cli('history', 'export', '--config', join(root, 'service.json'), '--since', '2000-01-01');
    expect(csv.status, csv.stderr).toBe(0);
    expect(csv.stdout.split('\n')[2]).toMatch(
      /L BREAST TG,NG_LINAC1,beyond action level,yes,2,10\.25,beam 2: MU as typed\? \+11\.\d %,1,Physicist P,[^,]+,no$/,
    );
  });
});
