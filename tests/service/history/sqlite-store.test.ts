/** The SQLite history: the contract, and SQLite's own statement forms that would rewrite a record. */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { SqliteHistoryStore } from '../../../src/service/history/sqlite-store.js';
import { historyContract, newCheck } from './contract.js';

const newFile = () => join(mkdtempSync(join(tmpdir(), 'plumbline-hist-')), 'h.sqlite');

historyContract('SQLite', {
  open: async () => {
    const file = newFile();
    return {
      store: new SqliteHistoryStore(file),
      reopen: async () => new SqliteHistoryStore(file),
      raw: async (sql) => {
        const db = new Database(file);
        try {
          return db.prepare(sql).run();
        } finally {
          db.close();
        }
      },
    };
  },
});

describe('the SQLite history', () => {
  it('refuses every statement form that would rewrite a record: UPDATE, DELETE, REPLACE, INSERT OR REPLACE, UPSERT', async () => {
    // The statement forms of SQLite's documentation (sqlite.org, lang_insert and lang_upsert); REPLACE deletes the old row
    // without firing a DELETE trigger, so each form is tried on each table.
    const file = newFile();
    const store = new SqliteHistoryStore(file);
    const id = (await store.recordCheck(newCheck()))!;
    const review = await store.addReview({
      checkId: id,
      reviewer: 'Physicist R',
      reviewedAt: '2026-12-02T08:00:00.000Z',
      accepted: true,
      comment: '',
    });
    const outcome = await store.recordIntakeOutcome({
      recordedAt: '2026-12-02T08:00:00.000Z',
      outcome: 'refused',
      fileName: 'x.dcm',
      reason: 'test',
    });
    const raw = new Database(file);
    const rows = {
      checks: `(id, recorded_at, plan_sop_instance_uid, plan_sha256, plan_label, verdict, fully_verified, tool_version, inputs_json, result_json, html)
        VALUES (${id}, 'x', 'x', 'x', 'x', 'within tolerance', 1, 'x', '[]', '{}', '')`,
      reviews: `(id, check_id, reviewer, reviewed_at, accepted, comment) VALUES (${review}, ${id}, 'Someone Else', 'x', 1, '')`,
      intake_outcomes: `(id, recorded_at, outcome, file_name, reason) VALUES (${outcome}, 'x', 'failed', 'y', 'z')`,
    };
    for (const [table, values] of Object.entries(rows)) {
      const first = Object.values(raw.prepare(`SELECT * FROM ${table} ORDER BY id LIMIT 1`).get() as object);
      for (const sql of [
        `UPDATE ${table} SET id = id`,
        `DELETE FROM ${table}`,
        `REPLACE INTO ${table} ${values}`,
        `INSERT OR REPLACE INTO ${table} ${values}`,
        `INSERT INTO ${table} ${values} ON CONFLICT (id) DO UPDATE SET id = excluded.id`,
        `INSERT OR IGNORE INTO ${table} ${values}`,
      ]) {
        expect(() => raw.prepare(sql).run(), sql).toThrow(/append-only/);
      }
      expect(Object.values(raw.prepare(`SELECT * FROM ${table} ORDER BY id LIMIT 1`).get() as object)).toEqual(first);
    }
    raw.close();
    await store.close();
  });
});
