/**
 * The PostgreSQL history, on a real server the tests start (a throwaway cluster: initdb into a
 * temporary folder, a Unix socket there) and stop: the contract, PostgreSQL's own rewriting forms,
 * and two stores on one database (two intake nodes) working on the same plan.
 */
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PostgresHistoryStore } from '../../../src/service/history/postgres-store.js';
import { startThrowawayPostgres, type ThrowawayPostgres } from '../../helpers/postgres.js';
import { historyContract, newCheck } from './contract.js';

let server: ThrowawayPostgres;
let n = 0;
beforeAll(() => {
  server = startThrowawayPostgres();
}, 60_000);
afterAll(() => server?.stop());

async function fresh() {
  const url = await server.newDatabase(`history_${++n}`);
  const open = () => PostgresHistoryStore.open({ connectionString: url }, url);
  const raw = async (sql: string) => {
    const c = new pg.Client({ connectionString: url });
    await c.connect();
    try {
      return await c.query(sql);
    } finally {
      await c.end();
    }
  };
  return { url, open, raw };
}

historyContract('PostgreSQL', {
  open: async () => {
    const f = await fresh();
    return { store: await f.open(), reopen: f.open, raw: f.raw };
  },
});

describe('the PostgreSQL history', () => {
  it('refuses TRUNCATE and an upsert onto a record, as it refuses UPDATE and DELETE', async () => {
    const f = await fresh();
    const store = await f.open();
    const id = (await store.recordCheck(newCheck()))!;
    for (const table of ['checks', 'reviews', 'intake_outcomes'])
      await expect(f.raw(`TRUNCATE ${table} CASCADE`), table).rejects.toThrow(/append-only/);
    await expect(
      f.raw(`INSERT INTO checks (id, recorded_at, plan_sop_instance_uid, plan_sha256, plan_label, verdict, fully_verified, tool_version, inputs_json,
        result_json, html) OVERRIDING SYSTEM VALUE VALUES (${id}, 'x', 'x', 'x', 'x', 'within tolerance', true, 'x', '[]', '{}', '')
        ON CONFLICT (id) DO UPDATE SET verdict = 'within tolerance'`),
    ).rejects.toThrow(/append-only/);
    expect(await store.listChecks()).toEqual([expect.objectContaining({ id, verdict: newCheck().result.verdict })]);
    await store.close();
  });

  it('two nodes on one database, both starting (migrating) at once, then working on the same plan: one record, the second sees it', async () => {
    const f = await fresh();
    const [a, b] = await Promise.all([f.open(), f.open()]);
    expect(await a.schemaVersion()).toBe(7);
    const key = { sopInstanceUid: newCheck().result.sopInstanceUid, sha256: 'a'.repeat(64) };
    const work = (store: PostgresHistoryStore) =>
      store.exclusively(key, async () => {
        if (await store.alreadyChecked(key)) return 'duplicate';
        await new Promise((r) => setTimeout(r, 50));
        return (await store.recordCheck(newCheck())) === undefined ? 'lost the race' : 'checked';
      });
    const outcomes = await Promise.all([work(a), work(b), work(a), work(b)]);
    expect(outcomes.sort()).toEqual(['checked', 'duplicate', 'duplicate', 'duplicate']);
    expect(await b.listChecks()).toHaveLength(1);
    await a.close();
    await b.close();
  });

  it('a node whose connection dies releases the plan it held', async () => {
    const f = await fresh();
    const [a, b] = await Promise.all([f.open(), f.open()]);
    const key = { sopInstanceUid: '2.25.42', sha256: 'a'.repeat(64) };
    let release: () => void = () => undefined;
    const held = a.exclusively(key, () => new Promise<void>((r) => (release = r)));
    await new Promise((r) => setTimeout(r, 100));
    // Node a's connections end as a killed process's would: the server drops them.
    await f.raw("SELECT pg_terminate_backend(pid) FROM pg_stat_activity WHERE query LIKE '%pg_advisory_lock%' AND pid <> pg_backend_pid()");
    expect(await b.exclusively(key, async () => 'taken over')).toBe('taken over');
    release();
    await held.catch(() => undefined);
    await a.close().catch(() => undefined);
    await b.close();
  });
});
