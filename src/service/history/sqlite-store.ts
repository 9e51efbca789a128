import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import Database from 'better-sqlite3';
import {
  type CheckFilter,
  type CheckRecord,
  type HistoryStore,
  IntakeOutcome,
  type NewCheck,
  type PlanKey,
  ReviewRecord,
  StoredResult,
  UserRecord,
} from './store.js';
import { type CheckRow, type OutcomeRow, type ReviewRow, toOutcome, toRecord, toReview, toUser, type UserRow } from './rows.js';
import { SQLITE_MIGRATIONS } from './sqlite-migrations.js';

/** How long a writer waits for another process's write to finish (ms). */
const BUSY_TIMEOUT_MS = 30_000;

/**
 * The history in one SQLite file (better-sqlite3): the embedded default, needing no server.
 * Append-only by triggers. Several processes may share the file; `exclusively` holds SQLite's
 * write lock (BEGIN IMMEDIATE) while a plan is worked on, so one writer at a time — for several
 * intake nodes, PostgreSQL is the store to use.
 */
export class SqliteHistoryStore implements HistoryStore {
  private readonly db: Database.Database;
  /** `exclusively` calls of this process, one after the other (SQLite has one transaction per connection). */
  private queue: Promise<unknown> = Promise.resolve();
  readonly where: string;

  constructor(file: string) {
    if (file !== ':memory:') mkdirSync(dirname(file), { recursive: true });
    this.where = file;
    this.db = new Database(file);
    this.db.pragma('journal_mode = WAL');
    this.db.pragma('foreign_keys = ON');
    this.db.pragma(`busy_timeout = ${BUSY_TIMEOUT_MS}`);
    this.migrate();
  }

  private migrate(): void {
    this.db.exec('CREATE TABLE IF NOT EXISTS schema_migrations (version INTEGER PRIMARY KEY, applied_at TEXT NOT NULL)');
    const apply = this.db.transaction(() => {
      const done = new Set((this.db.prepare('SELECT version FROM schema_migrations').all() as { version: number }[]).map((r) => r.version));
      for (const m of SQLITE_MIGRATIONS) {
        if (done.has(m.version)) continue;
        this.db.exec(m.sql);
        this.db.prepare('INSERT INTO schema_migrations (version, applied_at) VALUES (?, ?)').run(m.version, new Date().toISOString());
      }
    });
    // Immediate: two processes starting at once apply each migration once.
    apply.immediate();
  }

  async schemaVersion(): Promise<number> {
    return (this.db.prepare('SELECT MAX(version) AS v FROM schema_migrations').get() as { v: number }).v;
  }

  exclusively<T>(_key: PlanKey, work: () => Promise<T>): Promise<T> {
    const run = async () => {
      this.db.exec('BEGIN IMMEDIATE');
      try {
        return await work();
      } finally {
        // Committed whatever happened: the page may have written a review meanwhile on this connection.
        this.db.exec('COMMIT');
      }
    };
    const next = this.queue.then(run, run);
    this.queue = next.catch(() => undefined);
    return next;
  }

  async alreadyChecked(key: PlanKey): Promise<boolean> {
    return !!this.db
      .prepare('SELECT 1 FROM checks WHERE plan_sop_instance_uid = ? AND (plan_sha256 = ? OR plan_content_sha256 = ?) LIMIT 1')
      .get(key.sopInstanceUid, key.sha256, key.contentSha256 ?? null);
  }

  async recordCheck(c: NewCheck): Promise<number | undefined> {
    const r = c.result;
    try {
      const info = this.db
        .prepare(`INSERT INTO checks (recorded_at, plan_sop_instance_uid, plan_sha256, plan_label, patient_id, machine, verdict, fully_verified,
          tool_version, beam_data_version, beam_data_sha256, inputs_json, result_json, html, plan_content_sha256)
          VALUES (@recordedAt, @sop, @sha, @label, @patient, @machine, @verdict, @full, @tool, @bdv, @bds, @inputs, @result, @html, @content)`)
        .run({
          recordedAt: c.recordedAt,
          sop: r.sopInstanceUid,
          sha: c.planSha256,
          label: r.planLabel,
          patient: r.patientId ?? null,
          machine: r.machine?.dataName ?? null,
          verdict: r.verdict,
          full: r.fullyVerified ? 1 : 0,
          tool: c.toolVersion,
          bdv: c.beamDataVersion ?? null,
          bds: c.beamDataSha256 ?? null,
          inputs: JSON.stringify(c.inputs),
          result: JSON.stringify(r),
          html: c.html,
          content: c.planContentSha256 ?? null,
        });
      return Number(info.lastInsertRowid);
    } catch (e) {
      if ((e as { code?: string }).code === 'SQLITE_CONSTRAINT_UNIQUE') return undefined;
      throw e;
    }
  }

  async listChecks(f: CheckFilter = {}): Promise<CheckRecord[]> {
    const where: string[] = [];
    const args: unknown[] = [];
    if (f.id !== undefined) {
      where.push('id = ?');
      args.push(f.id);
    }
    if (f.since) {
      where.push('recorded_at >= ?');
      args.push(f.since);
    }
    if (f.verdicts?.length) {
      where.push(`verdict IN (${f.verdicts.map(() => '?').join(', ')})`);
      args.push(...f.verdicts);
    }
    if (f.machine) {
      where.push('machine = ?');
      args.push(f.machine);
    }
    if (f.needingReview) where.push("(verdict <> 'within tolerance' OR fully_verified = 0)");
    if (f.unreviewed) where.push('NOT EXISTS (SELECT 1 FROM reviews WHERE reviews.check_id = checks.id)');
    const order = f.oldestFirst ? 'recorded_at, id' : 'recorded_at DESC, id DESC';
    const rows = this.db
      .prepare(`SELECT id, recorded_at, plan_sop_instance_uid, plan_sha256, plan_label, patient_id, machine, verdict, fully_verified, tool_version,
      beam_data_version, beam_data_sha256, inputs_json FROM checks ${where.length ? `WHERE ${where.join(' AND ')}` : ''} ORDER BY ${order}`)
      .all(...args) as CheckRow[];
    return rows.map(toRecord);
  }

  async result(checkId: number): Promise<StoredResult | undefined> {
    const row = this.db.prepare('SELECT result_json FROM checks WHERE id = ?').get(checkId) as { result_json: string } | undefined;
    return row ? StoredResult.parse(JSON.parse(row.result_json)) : undefined;
  }

  async html(checkId: number): Promise<string | undefined> {
    return (this.db.prepare('SELECT html FROM checks WHERE id = ?').get(checkId) as { html: string } | undefined)?.html;
  }

  async addReview(r: Omit<ReviewRecord, 'id'>): Promise<number> {
    const v = ReviewRecord.omit({ id: true }).parse(r);
    return Number(
      this.db
        .prepare('INSERT INTO reviews (check_id, reviewer, reviewed_at, accepted, comment, reviewer_role) VALUES (?, ?, ?, ?, ?, ?)')
        .run(v.checkId, v.reviewer, v.reviewedAt, v.accepted ? 1 : 0, v.comment, v.reviewerRole ?? null).lastInsertRowid,
    );
  }

  async reviews(checkId: number): Promise<ReviewRecord[]> {
    const rows = this.db
      .prepare('SELECT id, check_id, reviewer, reviewer_role, reviewed_at, accepted, comment FROM reviews WHERE check_id = ? ORDER BY id')
      .all(checkId) as ReviewRow[];
    return rows.map(toReview);
  }

  async recordIntakeOutcome(o: Omit<IntakeOutcome, 'id'>): Promise<number> {
    const v = IntakeOutcome.omit({ id: true }).parse(o);
    return Number(
      this.db
        .prepare(
          'INSERT INTO intake_outcomes (recorded_at, outcome, file_name, sop_instance_uid, sha256, reason, calling_ae_title) VALUES (?, ?, ?, ?, ?, ?, ?)',
        )
        .run(v.recordedAt, v.outcome, v.fileName, v.sopInstanceUid ?? null, v.sha256 ?? null, v.reason, v.callingAeTitle ?? null).lastInsertRowid,
    );
  }

  async intakeOutcomes(since = ''): Promise<IntakeOutcome[]> {
    const rows = this.db
      .prepare(
        `SELECT id, recorded_at, outcome, file_name, sop_instance_uid, sha256, reason, calling_ae_title FROM intake_outcomes
        WHERE recorded_at >= ? ORDER BY id DESC`,
      )
      .all(since) as OutcomeRow[];
    return rows.map(toOutcome);
  }

  async addUser(u: UserRecord): Promise<boolean> {
    const v = UserRecord.parse(u);
    const r = this.db
      .prepare('INSERT INTO users (name, role, password_hash, created_at) VALUES (?, ?, ?, ?) ON CONFLICT (name) DO NOTHING')
      .run(v.name, v.role, v.passwordHash, v.createdAt);
    return r.changes === 1;
  }

  async setPassword(name: string, passwordHash: string): Promise<boolean> {
    return this.db.prepare('UPDATE users SET password_hash = ? WHERE name = ?').run(passwordHash, name).changes === 1;
  }

  async user(name: string): Promise<UserRecord | undefined> {
    const r = this.db.prepare('SELECT name, role, password_hash, created_at FROM users WHERE name = ?').get(name) as UserRow | undefined;
    return r ? toUser(r) : undefined;
  }

  async users(): Promise<UserRecord[]> {
    return (this.db.prepare('SELECT name, role, password_hash, created_at FROM users ORDER BY name').all() as UserRow[]).map(toUser);
  }

  async close(): Promise<void> {
    this.db.close();
  }
}
