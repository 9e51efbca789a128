import { mkdirSync } from 'node:fs';
import { dirname } from 'node:path';
import Database from 'better-sqlite3';
import { z } from 'zod';
import { type PlanCheck, PlanVerdict } from '../../model/index.js';
import { MIGRATIONS } from './migrations.js';

/** One input of a check, by role, with its identity. */
export const CheckInput = z.object({ kind: z.string(), sopInstanceUid: z.string(), sha256: z.string() });
export type CheckInput = z.infer<typeof CheckInput>;

export const CheckRecord = z.object({
  id: z.number(),
  recordedAt: z.string(),
  planSopInstanceUid: z.string(),
  planSha256: z.string(),
  planLabel: z.string(),
  patientId: z.string().optional(),
  machine: z.string().optional(),
  verdict: PlanVerdict,
  fullyVerified: z.boolean(),
  toolVersion: z.string(),
  beamDataVersion: z.string().optional(),
  beamDataSha256: z.string().optional(),
  inputs: z.array(CheckInput),
});
export type CheckRecord = z.infer<typeof CheckRecord>;

/**
 * What the page reads back from a stored result: the parts every result schema has carried, so
 * checks recorded by an earlier version stay readable (their full report is the stored HTML).
 */
export const StoredResult = z.object({
  planLabel: z.string(),
  verdict: PlanVerdict,
  fullyVerified: z.boolean(),
  fractionGroups: z.array(
    z.object({
      beams: z.array(
        z.object({
          status: z.string(),
          beamNumber: z.number().optional(),
          radiationType: z.string(),
          nominalEnergy: z.number().optional(),
          calculation: z.object({ doseDeviationPercent: z.number().optional() }).optional(),
          // Results recorded before explanations existed have none; one that cannot be read is left out.
          explanation: z
            .object({ causes: z.array(z.object({ code: z.string(), contributionPercent: z.number() })) })
            .optional()
            .catch(undefined),
        }),
      ),
    }),
  ),
});
export type StoredResult = z.infer<typeof StoredResult>;

export const ReviewRecord = z.object({
  id: z.number(),
  checkId: z.number(),
  reviewer: z.string().min(1),
  reviewedAt: z.string(),
  accepted: z.boolean(),
  comment: z.string(),
});
export type ReviewRecord = z.infer<typeof ReviewRecord>;

/** An object that arrived and was not checked: refused for its input, or failed by an error of ours. */
export const IntakeOutcome = z.object({
  id: z.number(),
  recordedAt: z.string(),
  outcome: z.enum(['refused', 'failed']),
  /** The name it arrived under (the watched folder's file name, or the inbox name the receiver gave it). */
  fileName: z.string(),
  sopInstanceUid: z.string().optional(),
  sha256: z.string().optional(),
  reason: z.string(),
});
export type IntakeOutcome = z.infer<typeof IntakeOutcome>;

export interface NewCheck {
  readonly recordedAt: string;
  readonly result: PlanCheck;
  readonly planSha256: string;
  /** The plan's content whatever its encoding (see planContentSha256). */
  readonly planContentSha256?: string;
  readonly toolVersion: string;
  readonly beamDataVersion?: string;
  readonly beamDataSha256?: string;
  readonly inputs: readonly CheckInput[];
  /** The plan's report page, as `check --html` writes it. */
  readonly html: string;
}

export interface CheckFilter {
  /** ISO date or date-time: records at or after it. */
  readonly since?: string;
  readonly verdicts?: readonly PlanVerdict[];
  readonly machine?: string;
}

interface Row {
  id: number;
  recorded_at: string;
  plan_sop_instance_uid: string;
  plan_sha256: string;
  plan_label: string;
  patient_id: string | null;
  machine: string | null;
  verdict: string;
  fully_verified: number;
  tool_version: string;
  beam_data_version: string | null;
  beam_data_sha256: string | null;
  inputs_json: string;
}

/**
 * The record of every check and review, in SQLite (embedded, one file). Append-only by triggers;
 * the only SQL of the project lives here and in the migrations.
 */
export class HistoryStore {
  private readonly db: Database.Database;

  constructor(file: string) {
    if (file !== ':memory:') mkdirSync(dirname(file), { recursive: true });
    this.db = new Database(file);
    this.db.pragma('journal_mode = WAL');
    this.db.pragma('foreign_keys = ON');
    this.migrate();
  }

  private migrate(): void {
    this.db.exec('CREATE TABLE IF NOT EXISTS schema_migrations (version INTEGER PRIMARY KEY, applied_at TEXT NOT NULL)');
    const done = new Set((this.db.prepare('SELECT version FROM schema_migrations').all() as { version: number }[]).map((r) => r.version));
    for (const m of MIGRATIONS) {
      if (done.has(m.version)) continue;
      this.db.transaction(() => {
        this.db.exec(m.sql);
        this.db.prepare('INSERT INTO schema_migrations (version, applied_at) VALUES (?, ?)').run(m.version, new Date().toISOString());
      })();
    }
  }

  /** The schema version in force. */
  schemaVersion(): number {
    return (this.db.prepare('SELECT MAX(version) AS v FROM schema_migrations').get() as { v: number }).v;
  }

  recordCheck(c: NewCheck): number {
    const r = c.result;
    const info = this.db
      .prepare(`INSERT INTO checks (recorded_at, plan_sop_instance_uid, plan_sha256, plan_label, patient_id, machine, verdict, fully_verified, tool_version,
        beam_data_version, beam_data_sha256, inputs_json, result_json, html, plan_content_sha256)
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
  }

  /** Whether this plan (same SOP instance, same content) was already checked: a duplicate send. */
  alreadyChecked(planSopInstanceUid: string, planSha256: string, planContentSha256?: string): boolean {
    return !!this.db
      .prepare('SELECT 1 FROM checks WHERE plan_sop_instance_uid = ? AND (plan_sha256 = ? OR plan_content_sha256 = ?) LIMIT 1')
      .get(planSopInstanceUid, planSha256, planContentSha256 ?? null);
  }

  listChecks(f: CheckFilter = {}): CheckRecord[] {
    const where: string[] = [];
    const args: unknown[] = [];
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
    const rows = this.db
      .prepare(`SELECT id, recorded_at, plan_sop_instance_uid, plan_sha256, plan_label, patient_id, machine, verdict, fully_verified, tool_version,
      beam_data_version, beam_data_sha256, inputs_json FROM checks ${where.length ? `WHERE ${where.join(' AND ')}` : ''} ORDER BY recorded_at DESC, id DESC`)
      .all(...args) as Row[];
    return rows.map(toRecord);
  }

  /** The result of one check as the page reads it, validated as it is read back. */
  result(checkId: number): StoredResult | undefined {
    const row = this.db.prepare('SELECT result_json FROM checks WHERE id = ?').get(checkId) as { result_json: string } | undefined;
    return row ? StoredResult.parse(JSON.parse(row.result_json)) : undefined;
  }

  html(checkId: number): string | undefined {
    return (this.db.prepare('SELECT html FROM checks WHERE id = ?').get(checkId) as { html: string } | undefined)?.html;
  }

  /** A physicist's review: always a new record. */
  addReview(r: Omit<ReviewRecord, 'id'>): number {
    const v = ReviewRecord.omit({ id: true }).parse(r);
    return Number(
      this.db
        .prepare('INSERT INTO reviews (check_id, reviewer, reviewed_at, accepted, comment) VALUES (?, ?, ?, ?, ?)')
        .run(v.checkId, v.reviewer, v.reviewedAt, v.accepted ? 1 : 0, v.comment).lastInsertRowid,
    );
  }

  reviews(checkId: number): ReviewRecord[] {
    const rows = this.db
      .prepare('SELECT id, check_id, reviewer, reviewed_at, accepted, comment FROM reviews WHERE check_id = ? ORDER BY id')
      .all(checkId) as { id: number; check_id: number; reviewer: string; reviewed_at: string; accepted: number; comment: string }[];
    return rows.map((x) => ({
      id: x.id,
      checkId: x.check_id,
      reviewer: x.reviewer,
      reviewedAt: x.reviewed_at,
      accepted: x.accepted === 1,
      comment: x.comment,
    }));
  }

  recordIntakeOutcome(o: Omit<IntakeOutcome, 'id'>): number {
    const v = IntakeOutcome.omit({ id: true }).parse(o);
    return Number(
      this.db
        .prepare('INSERT INTO intake_outcomes (recorded_at, outcome, file_name, sop_instance_uid, sha256, reason) VALUES (?, ?, ?, ?, ?, ?)')
        .run(v.recordedAt, v.outcome, v.fileName, v.sopInstanceUid ?? null, v.sha256 ?? null, v.reason).lastInsertRowid,
    );
  }

  /** Objects refused or failed at intake since a date (ISO), newest first. */
  intakeOutcomes(since = ''): IntakeOutcome[] {
    const rows = this.db
      .prepare(
        'SELECT id, recorded_at, outcome, file_name, sop_instance_uid, sha256, reason FROM intake_outcomes WHERE recorded_at >= ? ORDER BY id DESC',
      )
      .all(since) as {
      id: number;
      recorded_at: string;
      outcome: string;
      file_name: string;
      sop_instance_uid: string | null;
      sha256: string | null;
      reason: string;
    }[];
    return rows.map((r) =>
      IntakeOutcome.parse({
        id: r.id,
        recordedAt: r.recorded_at,
        outcome: r.outcome,
        fileName: r.file_name,
        ...(r.sop_instance_uid !== null ? { sopInstanceUid: r.sop_instance_uid } : {}),
        ...(r.sha256 !== null ? { sha256: r.sha256 } : {}),
        reason: r.reason,
      }),
    );
  }

  close(): void {
    this.db.close();
  }
}

function toRecord(r: Row): CheckRecord {
  return CheckRecord.parse({
    id: r.id,
    recordedAt: r.recorded_at,
    planSopInstanceUid: r.plan_sop_instance_uid,
    planSha256: r.plan_sha256,
    planLabel: r.plan_label,
    ...(r.patient_id !== null ? { patientId: r.patient_id } : {}),
    ...(r.machine !== null ? { machine: r.machine } : {}),
    verdict: r.verdict,
    fullyVerified: r.fully_verified === 1,
    toolVersion: r.tool_version,
    ...(r.beam_data_version !== null ? { beamDataVersion: r.beam_data_version } : {}),
    ...(r.beam_data_sha256 !== null ? { beamDataSha256: r.beam_data_sha256 } : {}),
    inputs: JSON.parse(r.inputs_json),
  });
}
