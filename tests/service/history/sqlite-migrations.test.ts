/**
 * The SQLite history's migrations: numbered 1, 2, 3… without a gap, applied by the store at start,
 * and the schema they leave read back by Python's own sqlite3 module (an independent reader): the
 * tables, and the append-only triggers refusing UPDATE, DELETE and INSERT OR REPLACE.
 */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { SQLITE_MIGRATIONS } from '../../../src/service/history/sqlite-migrations.js';
import { SqliteHistoryStore } from '../../../src/service/history/sqlite-store.js';

const python = (code: string, file: string) => {
  const r = spawnSync('python3', ['-c', code, file], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(r.stderr);
  return r.stdout.trim();
};

describe('SQLite migrations', () => {
  it('are numbered from 1 without a gap', () => {
    expect(SQLITE_MIGRATIONS.map((m) => m.version)).toEqual(SQLITE_MIGRATIONS.map((_, i) => i + 1));
  });
  it('leave the tables of the history, every version recorded once, as Python’s sqlite3 reads the file', async () => {
    const file = join(mkdtempSync(join(tmpdir(), 'plumbline-migrations-')), 'history.sqlite');
    await new SqliteHistoryStore(file).close();
    const tables = python(
      `import sqlite3,sys
c=sqlite3.connect(sys.argv[1])
print(','.join(sorted(r[0] for r in c.execute("select name from sqlite_master where type='table'"))))`,
      file,
    );
    expect(tables.split(',')).toEqual(expect.arrayContaining(['checks', 'reviews', 'intake_outcomes', 'users', 'schema_migrations']));
    const versions = python(
      `import sqlite3,sys
c=sqlite3.connect(sys.argv[1])
print(','.join(str(r[0]) for r in c.execute('select version from schema_migrations order by version')))`,
      file,
    );
    expect(versions).toBe(SQLITE_MIGRATIONS.map((m) => m.version).join(','));
  });
  it('the append-only triggers refuse an update, a delete and a replace from another client', async () => {
    const file = join(mkdtempSync(join(tmpdir(), 'plumbline-migrations-')), 'history.sqlite');
    await new SqliteHistoryStore(file).close();
    const outcomes = python(
      `import sqlite3,sys
c=sqlite3.connect(sys.argv[1])
c.execute("insert into intake_outcomes (id, recorded_at, outcome, file_name, reason) values (1, 't', 'refused', 'f', 'r')")
c.commit()
attempts = [
  "update intake_outcomes set reason = 'x'",
  "delete from intake_outcomes",
  "insert or replace into intake_outcomes (id, recorded_at, outcome, file_name, reason) values (1, 't', 'failed', 'f', 'r')",
]
for sql in attempts:
  try:
    c.execute(sql); c.commit(); print('allowed')
  except sqlite3.DatabaseError as e:
    print(e)`,
      file,
    );
    expect(outcomes.split('\n')).toEqual(Array(3).fill('the history is append-only'));
  });
});
