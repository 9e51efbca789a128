import { COMMON_MIGRATIONS } from './common-migrations.js';

/**
 * The SQLite history's schema, one migration per step, applied in order and recorded in
 * `schema_migrations`; postgres-migrations.ts keeps the same versions for PostgreSQL. Never edit a
 * migration that has shipped: add the next one, to both.
 */
export const SQLITE_MIGRATIONS: readonly { readonly version: number; readonly sql: string }[] = [
  {
    version: 1,
    sql: `
      CREATE TABLE checks (
        id INTEGER PRIMARY KEY,
        recorded_at TEXT NOT NULL,
        plan_sop_instance_uid TEXT NOT NULL,
        plan_sha256 TEXT NOT NULL,
        plan_label TEXT NOT NULL,
        patient_id TEXT,
        machine TEXT,
        verdict TEXT NOT NULL,
        fully_verified INTEGER NOT NULL,
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
        id INTEGER PRIMARY KEY,
        check_id INTEGER NOT NULL REFERENCES checks (id),
        reviewer TEXT NOT NULL,
        reviewed_at TEXT NOT NULL,
        accepted INTEGER NOT NULL,
        comment TEXT NOT NULL
      );
      CREATE INDEX reviews_check ON reviews (check_id);
      -- Append-only: a record is never changed or removed; a review is a new record.
      CREATE TRIGGER checks_no_update BEFORE UPDATE ON checks BEGIN SELECT RAISE(ABORT, 'the history is append-only'); END;
      CREATE TRIGGER checks_no_delete BEFORE DELETE ON checks BEGIN SELECT RAISE(ABORT, 'the history is append-only'); END;
      CREATE TRIGGER reviews_no_update BEFORE UPDATE ON reviews BEGIN SELECT RAISE(ABORT, 'the history is append-only'); END;
      CREATE TRIGGER reviews_no_delete BEFORE DELETE ON reviews BEGIN SELECT RAISE(ABORT, 'the history is append-only'); END;
    `,
  },
  {
    version: 2,
    sql: `
      -- Every object that arrived and was not checked ends here: refused (its input) or failed (our error), with the reason.
      CREATE TABLE intake_outcomes (
        id INTEGER PRIMARY KEY,
        recorded_at TEXT NOT NULL,
        outcome TEXT NOT NULL CHECK (outcome IN ('refused', 'failed')),
        file_name TEXT NOT NULL,
        sop_instance_uid TEXT,
        sha256 TEXT,
        reason TEXT NOT NULL
      );
      CREATE INDEX intake_outcomes_time ON intake_outcomes (recorded_at);
      CREATE TRIGGER intake_outcomes_no_update BEFORE UPDATE ON intake_outcomes BEGIN SELECT RAISE(ABORT, 'the history is append-only'); END;
      CREATE TRIGGER intake_outcomes_no_delete BEFORE DELETE ON intake_outcomes BEGIN SELECT RAISE(ABORT, 'the history is append-only'); END;
      -- INSERT OR REPLACE (and REPLACE) deletes the old row without a DELETE trigger: refuse any insert onto an existing id.
      CREATE TRIGGER checks_no_replace BEFORE INSERT ON checks WHEN EXISTS (SELECT 1 FROM checks WHERE id = NEW.id)
        BEGIN SELECT RAISE(ABORT, 'the history is append-only'); END;
      CREATE TRIGGER reviews_no_replace BEFORE INSERT ON reviews WHEN EXISTS (SELECT 1 FROM reviews WHERE id = NEW.id)
        BEGIN SELECT RAISE(ABORT, 'the history is append-only'); END;
      CREATE TRIGGER intake_outcomes_no_replace BEFORE INSERT ON intake_outcomes WHEN EXISTS (SELECT 1 FROM intake_outcomes WHERE id = NEW.id)
        BEGIN SELECT RAISE(ABORT, 'the history is append-only'); END;
    `,
  },
  ...COMMON_MIGRATIONS,
];
