/**
 * Several intake nodes on one PostgreSQL history (a throwaway server the test starts): two receivers
 * and a watched folder fed the same plans at once by dcmtk's storescu and a copy, then a receiver
 * killed (SIGKILL) in the middle of a burst and restarted. Each plan is recorded once and checked
 * once; nothing a node acknowledged is lost. The built command (dist/plumbline.mjs), one process per node.
 */
import { type ChildProcess, spawn } from 'node:child_process';
import { copyFileSync, mkdirSync, mkdtempSync, readdirSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { freePort, writeServiceConfig } from '../../scripts/lib/service-files.js';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PostgresHistoryStore } from '../../src/service/history/postgres-store.js';
import { startThrowawayPostgres, type ThrowawayPostgres } from '../helpers/postgres.js';
import { burstPlans } from '../helpers/burst-plans.js';
import { waitFor } from '../helpers/wait-for.js';

const BIN = fileURLToPath(new URL('../../dist/plumbline.mjs', import.meta.url));

let server: ThrowawayPostgres;
beforeAll(() => {
  server = startThrowawayPostgres();
}, 60_000);
afterAll(() => server?.stop());

interface Node {
  readonly c: ChildProcess;
  readonly log: () => string;
}

/** One node: its own folders and configuration, the shared history; `receive` (with a port and AE title) or `watch`. */
function node(root: string, name: string, url: string, o: { port?: number; watch?: string }): { start: () => Node; inbox: string } {
  const dir = join(root, name);
  mkdirSync(dir, { recursive: true });
  const config = writeServiceConfig(join(dir, 'service.json'), {
    ...(o.port ? { receiver: { port: o.port, aeTitle: name, allowedCallingAeTitles: ['NG_TPS'] } } : {}),
    history: { kind: 'postgres', url },
    settleSeconds: 0,
    watchStableSeconds: 0,
  });
  const args = o.port ? ['receive', '--config', config] : ['watch', o.watch!, '--config', config];
  return {
    inbox: join(dir, 'inbox'),
    start: () => {
      const c = spawn(process.execPath, [BIN, ...args], { stdio: ['ignore', 'ignore', 'pipe'] });
      let err = '';
      c.stderr!.on('data', (d) => {
        err += d;
      });
      return { c, log: () => err };
    },
  };
}

/** storescu -v: every file it sent and had a success response for, as it goes. */
function storescu(port: number, aet: string, files: readonly string[]) {
  const p = spawn('storescu', ['-v', '-aet', 'NG_TPS', '-aec', aet, '127.0.0.1', String(port), ...files]);
  let out = '';
  p.stdout.on('data', (d) => {
    out += d;
  });
  p.stderr.on('data', (d) => {
    out += d;
  });
  const done = new Promise<void>((r) => p.on('exit', () => r()));
  const acknowledged = () => {
    const files: string[] = [];
    let current: string | undefined;
    for (const line of out.split('\n')) {
      const sending = /Sending file: (.*)$/.exec(line);
      if (sending) current = sending[1]!.trim();
      else if (/Received Store Response \(Success\)/.test(line) && current) files.push(current);
    }
    return files;
  };
  return { done, acknowledged };
}

const checkedLines = (nodes: readonly Node[]) => nodes.flatMap((n) => n.log().match(/checked plan "/g) ?? []).length;
const empty = (dir: string) => readdirSync(dir).filter((f) => !f.startsWith('.')).length === 0;

describe('several intake nodes on one PostgreSQL history', () => {
  it('two receivers and a watched folder fed the same 40 plans at once: each recorded once, checked once', async () => {
    const root = mkdtempSync(join(tmpdir(), 'plumbline-nodes-'));
    const url = await server.newDatabase('nodes_burst');
    const files = burstPlans(join(root, 'plans'), 'SAME', 40);
    const watched = join(root, 'export');
    mkdirSync(watched);
    const [pa, pb] = [await freePort(), await freePort()];
    const a = node(root, 'PLUMBLINE_A', url, { port: pa });
    const b = node(root, 'PLUMBLINE_B', url, { port: pb });
    const w = node(root, 'PLUMBLINE_W', url, { watch: watched });
    const running = [a.start(), b.start(), w.start()];
    try {
      expect(await waitFor(() => running[0]!.log().includes('receiving as PLUMBLINE_A'), 20_000)).toBe(true);
      expect(await waitFor(() => running[1]!.log().includes('receiving as PLUMBLINE_B'), 20_000)).toBe(true);
      const sends = [storescu(pa, 'PLUMBLINE_A', files), storescu(pb, 'PLUMBLINE_B', files)];
      for (const f of files) copyFileSync(f, join(watched, basename(f)));
      await Promise.all(sends.map((s) => s.done));
      expect(sends.every((s) => s.acknowledged().length === files.length)).toBe(true);
      const store = await PostgresHistoryStore.open({ connectionString: url }, url);
      try {
        expect(
          await waitFor(
            async () => empty(a.inbox) && empty(b.inbox) && empty(w.inbox) && empty(watched) && (await store.listChecks()).length >= files.length,
            60_000,
            100,
          ),
        ).toBe(true);
        await new Promise((r) => setTimeout(r, 1500)); // a last pass of every node
        const checks = await store.listChecks();
        expect(checks).toHaveLength(40);
        expect(new Set(checks.map((c) => c.planSopInstanceUid)).size).toBe(40);
        expect(checkedLines(running)).toBe(40);
        // No node checked a plan another was checking (they would meet at the database's unique key).
        expect(running.map((n) => n.log()).join('\n')).not.toMatch(/while it was checked here/);
        expect(running.map((n) => n.log()).join('\n')).toMatch(/duplicate: plan/);
      } finally {
        await store.close();
      }
    } finally {
      for (const n of running) n.c.kill('SIGTERM');
    }
  }, 120_000);

  it('two nodes started together on the same 60 plans already in their inboxes, in the same order: each plan checked by one of them', async () => {
    // The nodes meet on every plan at the same moment: without working on a plan alone, both would check it.
    const root = mkdtempSync(join(tmpdir(), 'plumbline-nodes-race-'));
    const url = await server.newDatabase('nodes_race');
    const files = burstPlans(join(root, 'plans'), 'RACE', 60);
    const [a, b] = [node(root, 'PLUMBLINE_A', url, { watch: join(root, 'none-a') }), node(root, 'PLUMBLINE_B', url, { watch: join(root, 'none-b') })];
    for (const n of [a, b]) {
      mkdirSync(n.inbox, { recursive: true });
      files.forEach((f, i) => copyFileSync(f, join(n.inbox, `${String(i).padStart(3, '0')}.dcm`)));
    }
    mkdirSync(join(root, 'none-a'));
    mkdirSync(join(root, 'none-b'));
    const running = [a.start(), b.start()];
    const store = await PostgresHistoryStore.open({ connectionString: url }, url);
    try {
      expect(await waitFor(async () => empty(a.inbox) && empty(b.inbox) && (await store.listChecks()).length >= 60, 60_000, 100)).toBe(true);
      expect(await store.listChecks()).toHaveLength(60);
      expect(checkedLines(running)).toBe(60);
      expect(running.map((n) => n.log()).join('\n')).not.toMatch(/while it was checked here/);
    } finally {
      await store.close();
      for (const n of running) n.c.kill('SIGTERM');
    }
  }, 120_000);

  it('a receiver killed (SIGKILL) in the middle of a burst to both: after its restart, everything acknowledged is recorded, nothing checked twice', async () => {
    const root = mkdtempSync(join(tmpdir(), 'plumbline-nodes-kill-'));
    const url = await server.newDatabase('nodes_kill');
    const files = burstPlans(join(root, 'plans'), 'KILL', 150);
    const [pa, pb] = [await freePort(), await freePort()];
    const a = node(root, 'PLUMBLINE_A', url, { port: pa });
    const b = node(root, 'PLUMBLINE_B', url, { port: pb });
    const logs: Node[] = [];
    let nodeA = a.start();
    const nodeB = b.start();
    logs.push(nodeA, nodeB);
    try {
      expect(await waitFor(() => nodeA.log().includes('receiving as PLUMBLINE_A') && nodeB.log().includes('receiving as PLUMBLINE_B'), 20_000)).toBe(
        true,
      );
      const toA = storescu(pa, 'PLUMBLINE_A', files);
      const toB = storescu(pb, 'PLUMBLINE_B', files);
      expect(await waitFor(() => toA.acknowledged().length >= 30, 30_000)).toBe(true);
      nodeA.c.kill('SIGKILL');
      await Promise.all([toA.done, toB.done]);
      const acknowledged = new Set([...toA.acknowledged(), ...toB.acknowledged()]);
      expect(toA.acknowledged().length).toBeLessThan(files.length);
      nodeA = a.start();
      logs.push(nodeA);
      const store = await PostgresHistoryStore.open({ connectionString: url }, url);
      try {
        const labels = async () => new Set((await store.listChecks()).map((c) => c.planLabel));
        const wanted = [...acknowledged].map((f) => basename(f, '.dcm').replace('-', ' '));
        expect(
          await waitFor(
            async () => {
              if (!empty(a.inbox) || !empty(b.inbox)) return false;
              const have = await labels();
              return wanted.every((l) => have.has(l));
            },
            60_000,
            100,
          ),
        ).toBe(true);
        await new Promise((r) => setTimeout(r, 1500));
        const checks = await store.listChecks();
        expect(new Set(checks.map((c) => c.planSopInstanceUid)).size).toBe(checks.length);
        // Every check a node said it made is the one record of its plan: none checked twice.
        expect(checkedLines(logs)).toBe(checks.length);
        expect(logs.map((n) => n.log()).join('\n')).not.toMatch(/while it was checked here/);
      } finally {
        await store.close();
      }
    } finally {
      for (const n of logs) n.c.kill('SIGTERM');
    }
  }, 120_000);
});
