import { z } from 'zod';
import { type PlanCheck, PlanVerdict } from '../../model/index.js';

/*
 * What the history holds, whatever the database: the records as they are read back (validated),
 * and what is written. The stores (SQLite, PostgreSQL) map these to their rows.
 */

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
          verdict: z.string().optional(),
          calculation: z
            .object({
              doseDeviationPercent: z.number().optional(),
              wedgeId: z.string().optional(),
              modulated: z.object({}).passthrough().optional(),
              approximations: z
                .array(z.object({ code: z.string() }).passthrough())
                .optional()
                .catch(undefined),
            })
            .optional(),
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
  /** The role the reviewer signed in with (absent for reviews recorded before sign-in). */
  reviewerRole: z.enum(['physicist', 'viewer']).optional(),
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
  /** For an object received over the network: the calling AE title that sent it. */
  callingAeTitle: z.string().optional(),
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
  /** One check by its number. */
  readonly id?: number;
  /** ISO date or date-time: records at or after it. */
  readonly since?: string;
  readonly verdicts?: readonly PlanVerdict[];
  readonly machine?: string;
  /** Only checks that want a physicist: not within tolerance, or not fully verified. */
  readonly needingReview?: boolean;
  /** Only checks without any review yet. */
  readonly unreviewed?: boolean;
  /** Oldest first (the default is newest first). */
  readonly oldestFirst?: boolean;
}

/** Who may sign in to the page: a physicist records reviews under their own name; a viewer reads. */
export const Role = z.enum(['physicist', 'viewer']);
export type Role = z.infer<typeof Role>;

/** An account: its name, role and password as an scrypt hash (see web/passwords.ts), never the password. */
export const UserRecord = z.object({
  name: z
    .string()
    .min(1)
    .max(64)
    .regex(/^[\p{L}\p{N} .'-]+$/u, 'a name of letters, digits, spaces, dots, apostrophes and hyphens'),
  role: Role,
  passwordHash: z.string().startsWith('scrypt$'),
  createdAt: z.string(),
});
export type UserRecord = z.infer<typeof UserRecord>;
