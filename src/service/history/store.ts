import type { CheckFilter, CheckRecord, IntakeOutcome, NewCheck, ReviewRecord, StoredResult, UserRecord } from './records.js';

export * from './records.js';

/** One plan's identity for recording it once: its SOP Instance UID and the hash of its content. */
export interface PlanKey {
  readonly sopInstanceUid: string;
  /** The file's SHA-256 as it arrived. */
  readonly sha256: string;
  /** The plan's content whatever its encoding (see planContentSha256), when it could be read. */
  readonly contentSha256?: string | undefined;
}

/**
 * The record of every check, review and intake outcome: append-only, in SQLite (embedded, one file)
 * or PostgreSQL (several intake nodes and desks on one database). The pipeline, the page and
 * `history` talk only to this.
 */
export interface HistoryStore {
  /** Where the history lives, in words for messages (a file, or a database without credentials). */
  readonly where: string;
  /** The schema version in force. */
  schemaVersion(): Promise<number>;
  /**
   * Works on one plan alone across every process sharing the history: while `work` runs, another
   * node's `exclusively` for the same plan waits, so it then sees what this one recorded. A node
   * that dies releases the plan (its lock goes with its connection or its file lock).
   */
  exclusively<T>(key: PlanKey, work: () => Promise<T>): Promise<T>;
  /** Whether this plan (same SOP instance, same file or content) was already checked. */
  alreadyChecked(key: PlanKey): Promise<boolean>;
  /** Records a check; undefined when the same plan is already recorded (the database's unique key). */
  recordCheck(c: NewCheck): Promise<number | undefined>;
  listChecks(f?: CheckFilter): Promise<CheckRecord[]>;
  /** The result of one check as the page reads it, validated as it is read back. */
  result(checkId: number): Promise<StoredResult | undefined>;
  html(checkId: number): Promise<string | undefined>;
  /** A physicist's review: always a new record. */
  addReview(r: Omit<ReviewRecord, 'id'>): Promise<number>;
  reviews(checkId: number): Promise<ReviewRecord[]>;
  recordIntakeOutcome(o: Omit<IntakeOutcome, 'id'>): Promise<number>;
  /** Objects refused or failed at intake since a date (ISO), newest first. */
  intakeOutcomes(since?: string): Promise<IntakeOutcome[]>;
  /** A new account; false when the name is taken. */
  addUser(u: UserRecord): Promise<boolean>;
  /** Sets an account's password hash; false when there is no such account. */
  setPassword(name: string, passwordHash: string): Promise<boolean>;
  user(name: string): Promise<UserRecord | undefined>;
  users(): Promise<UserRecord[]>;
  close(): Promise<void>;
}

/** The message both stores give when asked to change or remove a record. */
export const APPEND_ONLY = 'the history is append-only';
