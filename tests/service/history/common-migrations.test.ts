/** The migrations both dialects read alike: shared by both lists at the same versions, after the dialect-specific first two. */
import { describe, expect, it } from 'vitest';
import { COMMON_MIGRATIONS } from '../../../src/service/history/common-migrations.js';
import { POSTGRES_MIGRATIONS } from '../../../src/service/history/postgres-migrations.js';
import { SQLITE_MIGRATIONS } from '../../../src/service/history/sqlite-migrations.js';

describe('common migrations', () => {
  it('continue from version 3 without a gap', () => {
    expect(COMMON_MIGRATIONS.map((m) => m.version)).toEqual(COMMON_MIGRATIONS.map((_, i) => i + 3));
  });
  it('end both dialects’ lists, the same objects', () => {
    for (const list of [SQLITE_MIGRATIONS, POSTGRES_MIGRATIONS]) expect(list.slice(-COMMON_MIGRATIONS.length)).toEqual(COMMON_MIGRATIONS);
  });
  it('use no SQL of one dialect only (AUTOINCREMENT, SERIAL, PRAGMA, RAISE, plpgsql)', () => {
    for (const m of COMMON_MIGRATIONS) expect(m.sql).not.toMatch(/AUTOINCREMENT|SERIAL|PRAGMA|RAISE|plpgsql|GENERATED/i);
  });
});
