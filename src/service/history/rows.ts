import { CheckRecord, IntakeOutcome, ReviewRecord, UserRecord } from './records.js';

/** The columns of checks a list reads (without the result and the page), as either store returns them. */
export interface CheckRow {
  id: number;
  recorded_at: string;
  plan_sop_instance_uid: string;
  plan_sha256: string;
  plan_label: string;
  patient_id: string | null;
  machine: string | null;
  verdict: string;
  fully_verified: number | boolean;
  tool_version: string;
  beam_data_version: string | null;
  beam_data_sha256: string | null;
  inputs_json: string;
}

/** A row of intake_outcomes, in either store. */
export interface OutcomeRow {
  id: number;
  recorded_at: string;
  outcome: string;
  file_name: string;
  sop_instance_uid: string | null;
  sha256: string | null;
  reason: string;
  calling_ae_title: string | null;
}

export function toOutcome(r: OutcomeRow): IntakeOutcome {
  return IntakeOutcome.parse({
    id: r.id,
    recordedAt: r.recorded_at,
    outcome: r.outcome,
    fileName: r.file_name,
    ...(r.sop_instance_uid !== null ? { sopInstanceUid: r.sop_instance_uid } : {}),
    ...(r.sha256 !== null ? { sha256: r.sha256 } : {}),
    reason: r.reason,
    ...(r.calling_ae_title !== null ? { callingAeTitle: r.calling_ae_title } : {}),
  });
}

/** A row of checks (without its result and page), in either store: booleans as 0/1 or true/false, inputs as JSON text. */
export function toRecord(r: CheckRow): CheckRecord {
  return CheckRecord.parse({
    id: r.id,
    recordedAt: r.recorded_at,
    planSopInstanceUid: r.plan_sop_instance_uid,
    planSha256: r.plan_sha256,
    planLabel: r.plan_label,
    ...(r.patient_id !== null ? { patientId: r.patient_id } : {}),
    ...(r.machine !== null ? { machine: r.machine } : {}),
    verdict: r.verdict,
    fullyVerified: r.fully_verified === 1 || r.fully_verified === true,
    toolVersion: r.tool_version,
    ...(r.beam_data_version !== null ? { beamDataVersion: r.beam_data_version } : {}),
    ...(r.beam_data_sha256 !== null ? { beamDataSha256: r.beam_data_sha256 } : {}),
    inputs: JSON.parse(r.inputs_json),
  });
}

/** A row of users, in either store. */
export interface UserRow {
  name: string;
  role: string;
  password_hash: string;
  created_at: string;
}

export const toUser = (r: UserRow): UserRecord =>
  UserRecord.parse({ name: r.name, role: r.role, passwordHash: r.password_hash, createdAt: r.created_at });

/** A row of reviews, in either store: accepted as 0/1 or true/false. */
export interface ReviewRow {
  id: number;
  check_id: number;
  reviewer: string;
  reviewer_role: string | null;
  reviewed_at: string;
  accepted: number | boolean;
  comment: string;
}

export const toReview = (x: ReviewRow): ReviewRecord =>
  ReviewRecord.parse({
    id: x.id,
    checkId: x.check_id,
    reviewer: x.reviewer,
    ...(x.reviewer_role !== null ? { reviewerRole: x.reviewer_role } : {}),
    reviewedAt: x.reviewed_at,
    accepted: x.accepted === 1 || x.accepted === true,
    comment: x.comment,
  });
