import { createHash } from 'node:crypto';
import pg from 'pg';
import { POSTGRES_MIGRATIONS } from './postgres-migrations.js';
import { type CheckRow, type OutcomeRow, type ReviewRow, toOutcome, toRecord, toReview, toUser, type UserRow } from './rows.js';
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

/** The advisory lock under which migrations run (any constant of ours). */
const MIGRATION_LOCK = 7_370_001;
/** PostgreSQL's code for a unique-key violation. */
const UNIQUE_VIOLATION = '23505';

/** A 64-bit advisory-lock key for a plan, from its SOP Instance UID (as text, for pg's bigint). */
function planLockKey(key: PlanKey): string {
  const h = createHash('sha256').update(`plumbline plan ${key.sopInstanceUid}`).digest();
  return h.readBigInt64BE(0).toString();
}

/**
 * The history on a PostgreSQL server (the `pg` client): several intake nodes and desks on one
 * database. Append-only by triggers; a plan is worked on under a session advisory lock on its SOP
 * Instance UID, which the server releases when the connection ends (a node that dies holds nothing).
 */
export class PostgresHistoryStore implements HistoryStore {
  private constructor(
    private readonly pool: pg.Pool,
    readonly where: string,
  ) {}

  /** Connects and applies the migrations not yet applied. */
  static async open(config: pg.PoolConfig, where: string): Promise<PostgresHistoryStore> {
    const pool = new pg.Pool({ ...config, max: 4 });
    // An idle connection the server ended (a restart, an administrator) leaves the pool; the next query opens another.
    pool.on('error', () => undefined);
    const store = new PostgresHistoryStore(pool, where);
    try {
      await store.migrate();
    } catch (e) {
      await pool.end();
      throw e;
    }
    return store;
  }

  private async migrate(): Promise<void> {
    const c = await this.pool.connect();
    try {
      await c.query('SELECT pg_advisory_lock($1)', [MIGRATION_LOCK]);
      await c.query('CREATE TABLE IF NOT EXISTS schema_migrations (version INTEGER PRIMARY KEY, applied_at TEXT NOT NULL)');
      const done = new Set((await c.query<{ version: number }>('SELECT version FROM schema_migrations')).rows.map((r) => r.version));
      for (const m of POSTGRES_MIGRATIONS) {
        if (done.has(m.version)) continue;
        await c.query('BEGIN');
        try {
          await c.query(m.sql);
          await c.query('INSERT INTO schema_migrations (version, applied_at) VALUES ($1, $2)', [m.version, new Date().toISOString()]);
          await c.query('COMMIT');
        } catch (e) {
          await c.query('ROLLBACK');
          throw e;
        }
      }
    } finally {
      await c.query('SELECT pg_advisory_unlock($1)', [MIGRATION_LOCK]).catch(() => undefined);
      c.release();
    }
  }

  async schemaVersion(): Promise<number> {
    return (await this.pool.query<{ v: number }>('SELECT MAX(version) AS v FROM schema_migrations')).rows[0]!.v;
  }

  async exclusively<T>(key: PlanKey, work: () => Promise<T>): Promise<T> {
    const c = await this.pool.connect();
    let broken = false;
    // The lock's connection ended under us: the lock is gone with it, and the connection is not reused.
    const ended = () => {
      broken = true;
    };
    c.on('error', ended);
    try {
      await c.query('SELECT pg_advisory_lock($1)', [planLockKey(key)]);
      try {
        return await work();
      } finally {
        await c.query('SELECT pg_advisory_unlock($1)', [planLockKey(key)]).catch(() => {
          broken = true;
        });
      }
    } finally {
      // A connection whose unlock failed may still hold the lock: it is closed, not reused.
      c.off('error', ended);
      c.release(broken);
    }
  }

  async alreadyChecked(key: PlanKey): Promise<boolean> {
    const r = await this.pool.query(
      'SELECT 1 FROM checks WHERE plan_sop_instance_uid = $1 AND (plan_sha256 = $2 OR plan_content_sha256 = $3) LIMIT 1',
      [key.sopInstanceUid, key.sha256, key.contentSha256 ?? null],
    );
    return (r.rowCount ?? 0) > 0;
  }

  async recordCheck(c: NewCheck): Promise<number | undefined> {
    const r = c.result;
    try {
      const q = await this.pool.query<{ id: number }>(
        `INSERT INTO checks (recorded_at, plan_sop_instance_uid, plan_sha256, plan_label, patient_id, machine, verdict, fully_verified,
          tool_version, beam_data_version, beam_data_sha256, inputs_json, result_json, html, plan_content_sha256)
          VALUES ($1, $2, $3, $4, $5, $6, $7, $8, $9, $10, $11, $12, $13, $14, $15) RETURNING id`,
        [
          c.recordedAt,
          r.sopInstanceUid,
          c.planSha256,
          r.planLabel,
          r.patientId ?? null,
          r.machine?.dataName ?? null,
          r.verdict,
          r.fullyVerified,
          c.toolVersion,
          c.beamDataVersion ?? null,
          c.beamDataSha256 ?? null,
          JSON.stringify(c.inputs),
          JSON.stringify(r),
          c.html,
          c.planContentSha256 ?? null,
        ],
      );
      return q.rows[0]!.id;
    } catch (e) {
      if ((e as { code?: string }).code === UNIQUE_VIOLATION) return undefined;
      throw e;
    }
  }

  async listChecks(f: CheckFilter = {}): Promise<CheckRecord[]> {
    const where: string[] = [];
    const args: unknown[] = [];
    const arg = (v: unknown) => {
      args.push(v);
      return `$${args.length}`;
    };
    if (f.id !== undefined) where.push(`id = ${arg(f.id)}`);
    if (f.since) where.push(`recorded_at >= ${arg(f.since)}`);
    if (f.verdicts?.length) where.push(`verdict IN (${f.verdicts.map(arg).join(', ')})`);
    if (f.machine) where.push(`machine = ${arg(f.machine)}`);
    if (f.needingReview) where.push("(verdict <> 'within tolerance' OR NOT fully_verified)");
    if (f.unreviewed) where.push('NOT EXISTS (SELECT 1 FROM reviews WHERE reviews.check_id = checks.id)');
    const rows = await this.pool.query<CheckRow>(
      `SELECT id, recorded_at, plan_sop_instance_uid, plan_sha256, plan_label, patient_id, machine, verdict, fully_verified, tool_version,
      beam_data_version, beam_data_sha256, inputs_json FROM checks ${where.length ? `WHERE ${where.join(' AND ')}` : ''}
      ORDER BY ${f.oldestFirst ? 'recorded_at, id' : 'recorded_at DESC, id DESC'}`,
      args,
    );
    return rows.rows.map(toRecord);
  }

  async result(checkId: number): Promise<StoredResult | undefined> {
    const row = (await this.pool.query<{ result_json: string }>('SELECT result_json FROM checks WHERE id = $1', [checkId])).rows[0];
    return row ? StoredResult.parse(JSON.parse(row.result_json)) : undefined;
  }

  async html(checkId: number): Promise<string | undefined> {
    return (await this.pool.query<{ html: string }>('SELECT html FROM checks WHERE id = $1', [checkId])).rows[0]?.html;
  }

  async addReview(r: Omit<ReviewRecord, 'id'>): Promise<number> {
    const v = ReviewRecord.omit({ id: true }).parse(r);
    const q = await this.pool.query<{ id: number }>(
      'INSERT INTO reviews (check_id, reviewer, reviewed_at, accepted, comment, reviewer_role) VALUES ($1, $2, $3, $4, $5, $6) RETURNING id',
      [v.checkId, v.reviewer, v.reviewedAt, v.accepted, v.comment, v.reviewerRole ?? null],
    );
    return q.rows[0]!.id;
  }

  async reviews(checkId: number): Promise<ReviewRecord[]> {
    const q = await this.pool.query<ReviewRow>(
      'SELECT id, check_id, reviewer, reviewer_role, reviewed_at, accepted, comment FROM reviews WHERE check_id = $1 ORDER BY id',
      [checkId],
    );
    return q.rows.map(toReview);
  }

  async recordIntakeOutcome(o: Omit<IntakeOutcome, 'id'>): Promise<number> {
    const v = IntakeOutcome.omit({ id: true }).parse(o);
    const q = await this.pool.query<{ id: number }>(
      `INSERT INTO intake_outcomes (recorded_at, outcome, file_name, sop_instance_uid, sha256, reason, calling_ae_title)
        VALUES ($1, $2, $3, $4, $5, $6, $7) RETURNING id`,
      [v.recordedAt, v.outcome, v.fileName, v.sopInstanceUid ?? null, v.sha256 ?? null, v.reason, v.callingAeTitle ?? null],
    );
    return q.rows[0]!.id;
  }

  async intakeOutcomes(since = ''): Promise<IntakeOutcome[]> {
    const q = await this.pool.query<OutcomeRow>(
      `SELECT id, recorded_at, outcome, file_name, sop_instance_uid, sha256, reason, calling_ae_title FROM intake_outcomes
        WHERE recorded_at >= $1 ORDER BY id DESC`,
      [since],
    );
    return q.rows.map(toOutcome);
  }

  async addUser(u: UserRecord): Promise<boolean> {
    const v = UserRecord.parse(u);
    const r = await this.pool.query(
      'INSERT INTO users (name, role, password_hash, created_at) VALUES ($1, $2, $3, $4) ON CONFLICT (name) DO NOTHING',
      [v.name, v.role, v.passwordHash, v.createdAt],
    );
    return r.rowCount === 1;
  }

  async setPassword(name: string, passwordHash: string): Promise<boolean> {
    return (await this.pool.query('UPDATE users SET password_hash = $1 WHERE name = $2', [passwordHash, name])).rowCount === 1;
  }

  async user(name: string): Promise<UserRecord | undefined> {
    const r = (await this.pool.query<UserRow>('SELECT name, role, password_hash, created_at FROM users WHERE name = $1', [name])).rows[0];
    return r ? toUser(r) : undefined;
  }

  async users(): Promise<UserRecord[]> {
    return (await this.pool.query<UserRow>('SELECT name, role, password_hash, created_at FROM users ORDER BY name')).rows.map(toUser);
  }

  async close(): Promise<void> {
    await this.pool.end();
  }
}
