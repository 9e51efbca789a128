/** The history store: migrations recorded, records append-only (checked by writing to the database file directly), reviews as new records. */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import Database from 'better-sqlite3';
import { describe, expect, it } from 'vitest';
import { HistoryStore } from '../../src/service/history/store.js';
import { beams, check, importOrThrow } from '../helpers/check-run.js';
import { DEMO_MANIFEST, machine, manifestPath } from '../helpers/machines.js';

const result = check(importOrThrow(manifestPath('fixtures/demo/clinic/brain-laterals.dcm')), machine(DEMO_MANIFEST));

describe('the history store', () => {
  const file = join(mkdtempSync(join(tmpdir(), 'plumbline-hist-')), 'h.sqlite');
  const store = new HistoryStore(file);
  const id = store.recordCheck({
    recordedAt: '2026-12-01T10:00:00.000Z',
    result,
    planSha256: 'a'.repeat(64),
    toolVersion: 'test',
    inputs: [{ kind: 'plan', sopInstanceUid: result.sopInstanceUid, sha256: 'a'.repeat(64) }],
    html: '<p>report</p>',
  });

  it('keeps every check with its inputs and full result, and finds a duplicate by SOP instance and content', () => {
    expect(store.schemaVersion()).toBe(3);
    const [r] = store.listChecks();
    expect(r).toMatchObject({ id, planLabel: 'BRAIN LATS', verdict: result.verdict, fullyVerified: true });
    expect(beams(store.result(id)!)).toHaveLength(2);
    expect(store.alreadyChecked(result.sopInstanceUid, 'a'.repeat(64))).toBe(true);
    expect(store.alreadyChecked(result.sopInstanceUid, 'b'.repeat(64))).toBe(false);
    expect(store.listChecks({ since: '2026-12-02' })).toHaveLength(0);
    expect(store.listChecks({ verdicts: ['beyond action level'] })).toHaveLength(0);
  });

  it('refuses any change or removal of a record, from any client of the database file', () => {
    const raw = new Database(file);
    expect(() => raw.prepare("UPDATE checks SET verdict = 'within tolerance'").run()).toThrow(/append-only/);
    expect(() => raw.prepare('DELETE FROM checks').run()).toThrow(/append-only/);
    raw.close();
  });

  it('refuses every statement form that would rewrite a record: UPDATE, DELETE, REPLACE, INSERT OR REPLACE, UPSERT', () => {
    // The statement forms of SQLite's documentation (sqlite.org, lang_insert and lang_upsert); REPLACE deletes the old row
    // without firing a DELETE trigger, so each form is tried on each table.
    const raw = new Database(file);
    const review = store.addReview({ checkId: id, reviewer: 'Physicist R', reviewedAt: '2026-12-02T08:00:00.000Z', accepted: true, comment: '' });
    const outcome = store.recordIntakeOutcome({ recordedAt: '2026-12-02T08:00:00.000Z', outcome: 'refused', fileName: 'x.dcm', reason: 'test' });
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
    expect(store.listChecks()[0]).toMatchObject({ verdict: result.verdict });
  });

  it('a review is a new record; a second review does not replace the first', () => {
    store.addReview({ checkId: id, reviewer: 'Physicist A', reviewedAt: '2026-12-02T09:00:00.000Z', accepted: false, comment: 'check the point' });
    store.addReview({ checkId: id, reviewer: 'Physicist B', reviewedAt: '2026-12-02T10:00:00.000Z', accepted: true, comment: '' });
    expect(store.reviews(id).map((r) => [r.reviewer, r.accepted])).toEqual([
      ['Physicist R', true],
      ['Physicist A', false],
      ['Physicist B', true],
    ]);
    const raw = new Database(file);
    expect(() => raw.prepare('UPDATE reviews SET accepted = 1').run()).toThrow(/append-only/);
    raw.close();
    expect(() => store.addReview({ checkId: id, reviewer: '', reviewedAt: 'x', accepted: true, comment: '' })).toThrow();
  });

  it('opening the database again applies no migration twice', () => {
    const again = new HistoryStore(file);
    expect(again.schemaVersion()).toBe(3);
    expect(again.listChecks()).toHaveLength(1);
    again.close();
  });
});
