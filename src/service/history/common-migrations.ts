/**
 * The migrations whose SQL both dialects read alike (from version 3 on), shared by
 * sqlite-migrations.ts and postgres-migrations.ts. A later step needing dialect-specific SQL goes
 * into both of those files instead. Never edit a migration that has shipped.
 */
export const COMMON_MIGRATIONS: readonly { readonly version: number; readonly sql: string }[] = [
  {
    version: 3,
    sql: `
      -- The plan's content whatever its encoding (the importer's reading of it): a plan sent again in another transfer syntax is the same plan.
      ALTER TABLE checks ADD COLUMN plan_content_sha256 TEXT;
      CREATE INDEX checks_plan_content ON checks (plan_sop_instance_uid, plan_content_sha256);
    `,
  },
  {
    version: 4,
    sql: `
      -- One record per plan, whichever node checked it: the same SOP instance with the same file or content is one check.
      CREATE UNIQUE INDEX checks_once_file ON checks (plan_sop_instance_uid, plan_sha256);
      CREATE UNIQUE INDEX checks_once_content ON checks (plan_sop_instance_uid, plan_content_sha256) WHERE plan_content_sha256 IS NOT NULL;
    `,
  },
  {
    version: 5,
    sql: `
      -- Who sent an object refused or failed at intake (received over the network).
      ALTER TABLE intake_outcomes ADD COLUMN calling_ae_title TEXT;
    `,
  },
  {
    version: 6,
    sql: `
      -- Who may sign in to the page: a physicist records reviews, a viewer reads. The password as an scrypt hash only.
      -- Not append-only: an account's password changes.
      CREATE TABLE users (
        name TEXT PRIMARY KEY,
        role TEXT NOT NULL CHECK (role IN ('physicist', 'viewer')),
        password_hash TEXT NOT NULL,
        created_at TEXT NOT NULL
      );
    `,
  },
  {
    version: 7,
    sql: `
      -- The role the reviewer signed in with, for the sign-off (reviews before sign-in have none).
      ALTER TABLE reviews ADD COLUMN reviewer_role TEXT;
    `,
  },
];
