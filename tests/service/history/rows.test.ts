import { describe, expect, it } from 'vitest';
import { toOutcome, toRecord, toReview, toUser } from '../../../src/service/history/rows.js';

describe('rows of either store as records', () => {
  it('reads booleans as SQLite (0/1) and PostgreSQL (true/false) give them, and leaves NULLs out', () => {
    const row = {
      id: 1,
      recorded_at: '2026-12-01T00:00:00.000Z',
      plan_sop_instance_uid: '2.25.1',
      plan_sha256: 'a',
      plan_label: 'P',
      patient_id: null,
      machine: 'L',
      verdict: 'within tolerance',
      tool_version: 't',
      beam_data_version: null,
      beam_data_sha256: null,
      inputs_json: '[]',
    };
    expect(toRecord({ ...row, fully_verified: 1 }).fullyVerified).toBe(true);
    expect(toRecord({ ...row, fully_verified: false }).fullyVerified).toBe(false);
    expect(toRecord({ ...row, fully_verified: true })).not.toHaveProperty('patientId');
    const review = { id: 2, check_id: 1, reviewer: 'A', reviewer_role: null, reviewed_at: 'x', comment: '' };
    expect(toReview({ ...review, accepted: 1 })).toEqual({ id: 2, checkId: 1, reviewer: 'A', reviewedAt: 'x', accepted: true, comment: '' });
    expect(toReview({ ...review, reviewer_role: 'physicist', accepted: false })).toMatchObject({ reviewerRole: 'physicist', accepted: false });
  });
  it('validates what it reads back: an unknown verdict, outcome or role is refused, not passed on', () => {
    expect(() =>
      toOutcome({
        id: 1,
        recorded_at: 'x',
        outcome: 'lost',
        file_name: 'f',
        sop_instance_uid: null,
        sha256: null,
        reason: 'r',
        calling_ae_title: null,
      }),
    ).toThrow();
    expect(
      toOutcome({
        id: 1,
        recorded_at: 'x',
        outcome: 'refused',
        file_name: 'f',
        sop_instance_uid: null,
        sha256: null,
        reason: 'r',
        calling_ae_title: 'TPS',
      }),
    ).toMatchObject({
      callingAeTitle: 'TPS',
    });
    expect(() => toUser({ name: 'A', role: 'admin', password_hash: 'scrypt$x', created_at: 'x' })).toThrow();
  });
});
