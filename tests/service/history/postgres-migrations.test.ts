/**
 * The PostgreSQL history's migrations: numbered like SQLite's, and leaving the same tables with the
 * same columns as SQLite's (read from PostgreSQL's information_schema and from SQLite's own
 * table_info), so a history moved between the two loses nothing. On a server the test starts.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import pg from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { POSTGRES_MIGRATIONS } from '../../../src/service/history/postgres-migrations.js';
import { PostgresHistoryStore } from '../../../src/service/history/postgres-store.js';
import { SQLITE_MIGRATIONS } from '../../../src/service/history/sqlite-migrations.js';
import { SqliteHistoryStore } from '../../../src/service/history/sqlite-store.js';
import { startThrowawayPostgres, type ThrowawayPostgres } from '../../helpers/postgres.js';

let server: ThrowawayPostgres;
beforeAll(() => {
  server = startThrowawayPostgres();
}, 60_000);
afterAll(() => server?.stop());

const TABLES = ['checks', 'reviews', 'intake_outcomes', 'users'];

describe('PostgreSQL migrations', () => {
  it('are numbered as SQLite’s, from 1 without a gap', () => {
    expect(POSTGRES_MIGRATIONS.map((m) => m.version)).toEqual(SQLITE_MIGRATIONS.map((m) => m.version));
  });
  it('leave the tables and columns SQLite’s leave', async () => {
    const url = await server.newDatabase('migrations');
    await (await PostgresHistoryStore.open({ connectionString: url }, url)).close();
    const c = new pg.Client({ connectionString: url });
    await c.connect();
    const pgColumns = Object.fromEntries(
      await Promise.all(
        TABLES.map(async (t) => {
          const r = await c.query('SELECT column_name FROM information_schema.columns WHERE table_name = $1 ORDER BY column_name', [t]);
          return [t, r.rows.map((x: { column_name: string }) => x.column_name)] as const;
        }),
      ),
    );
    await c.end();
    const file = join(mkdtempSync(join(tmpdir(), 'plumbline-migrations-')), 'history.sqlite');
    await new SqliteHistoryStore(file).close();
    const db = new Database(file, { readonly: true });
    const sqliteColumns = Object.fromEntries(
      TABLES.map((t) => [t, (db.prepare(`PRAGMA table_info(${t})`).all() as { name: string }[]).map((x) => x.name).sort()] as const),
    );
    db.close();
    expect(pgColumns).toEqual(sqliteColumns);
    expect(pgColumns.checks).toEqual(expect.arrayContaining(['plan_sop_instance_uid', 'plan_sha256', 'plan_content_sha256', 'verdict']));
  }, 60_000);
});
