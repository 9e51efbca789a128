import { COMMON_MIGRATIONS } from './common-migrations.js';

/**
 * The PostgreSQL history's schema: the same versions as sqlite-migrations.ts, in PostgreSQL's
 * dialect, applied in order at start (under an advisory lock, so nodes starting together apply each
 * once) and recorded in `schema_migrations`. Never edit a migration that has shipped: add the next
 * one, to both.
 */
export const POSTGRES_MIGRATIONS: readonly { readonly version: number; readonly sql: string }[] = [
  {
    version: 1,
    sql: `
      CREATE TABLE checks (
        id INTEGER GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
        recorded_at TEXT NOT NULL,
        plan_sop_instance_uid TEXT NOT NULL,
        plan_sha256 TEXT NOT NULL,
        plan_label TEXT NOT NULL,
        patient_id TEXT,
        machine TEXT,
        verdict TEXT NOT NULL,
        fully_verified BOOLEAN NOT NULL,
        tool_version TEXT NOT NULL,
        beam_data_version TEXT,
        beam_data_sha256 TEXT,
        inputs_json TEXT NOT NULL,
        result_json TEXT NOT NULL,
        html TEXT NOT NULL
      );
      CREATE INDEX checks_plan ON checks (plan_sop_instance_uid, plan_sha256);
      CREATE INDEX checks_time ON checks (recorded_at);
      CREATE TABLE reviews (
        id INTEGER GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
        check_id INTEGER NOT NULL REFERENCES checks (id),
        reviewer TEXT NOT NULL,
        reviewed_at TEXT NOT NULL,
        accepted BOOLEAN NOT NULL,
        comment TEXT NOT NULL
      );
      CREATE INDEX reviews_check ON reviews (check_id);
      -- Append-only: a record is never changed or removed (nor the table emptied); a review is a new record.
      CREATE FUNCTION plumbline_append_only() RETURNS trigger LANGUAGE plpgsql AS $$
        BEGIN RAISE EXCEPTION 'the history is append-only'; END $$;
      CREATE TRIGGER checks_append_only BEFORE UPDATE OR DELETE ON checks FOR EACH ROW EXECUTE FUNCTION plumbline_append_only();
      CREATE TRIGGER checks_no_truncate BEFORE TRUNCATE ON checks FOR EACH STATEMENT EXECUTE FUNCTION plumbline_append_only();
      CREATE TRIGGER reviews_append_only BEFORE UPDATE OR DELETE ON reviews FOR EACH ROW EXECUTE FUNCTION plumbline_append_only();
      CREATE TRIGGER reviews_no_truncate BEFORE TRUNCATE ON reviews FOR EACH STATEMENT EXECUTE FUNCTION plumbline_append_only();
    `,
  },
  {
    version: 2,
    sql: `
      CREATE TABLE intake_outcomes (
        id INTEGER GENERATED ALWAYS AS IDENTITY PRIMARY KEY,
        recorded_at TEXT NOT NULL,
        outcome TEXT NOT NULL CHECK (outcome IN ('refused', 'failed')),
        file_name TEXT NOT NULL,
        sop_instance_uid TEXT,
        sha256 TEXT,
        reason TEXT NOT NULL
      );
      CREATE INDEX intake_outcomes_time ON intake_outcomes (recorded_at);
      CREATE TRIGGER intake_outcomes_append_only BEFORE UPDATE OR DELETE ON intake_outcomes FOR EACH ROW EXECUTE FUNCTION plumbline_append_only();
      CREATE TRIGGER intake_outcomes_no_truncate BEFORE TRUNCATE ON intake_outcomes FOR EACH STATEMENT EXECUTE FUNCTION plumbline_append_only();
    `,
  },
  ...COMMON_MIGRATIONS,
];
