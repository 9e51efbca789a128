/**
 * What the history reads back: a stored result's stable part, readable from today's results and
 * from older ones (fields added later absent, an unreadable explanation left out), and the rules an
 * account's name and password hash must meet.
 */
import { describe, expect, it } from 'vitest';
import { StoredResult, UserRecord } from '../../../src/service/history/records.js';
import { check, importOrThrow } from '../../helpers/check-run.js';
import { demoPlan } from '../../helpers/fixtures.js';
import { DEMO_MANIFEST, machine } from '../../helpers/machines.js';

describe('StoredResult', () => {
  it("reads today's result of a demo plan, beam by beam", () => {
    const result = check(importOrThrow(demoPlan('four-field-box.dcm')), machine(DEMO_MANIFEST));
    const stored = StoredResult.parse(JSON.parse(JSON.stringify(result)));
    expect(stored.planLabel).toBe(result.planLabel);
    expect(stored.fractionGroups[0]!.beams.map((b) => b.beamNumber)).toEqual(result.fractionGroups[0]!.beams.map((b) => b.beamNumber));
  });
  it('reads an older result without verdicts per beam, explanations or approximations', () => {
    const old = {
      planLabel: 'OLD',
      verdict: 'within tolerance',
      fullyVerified: true,
      fractionGroups: [{ beams: [{ status: 'checked', beamNumber: 1, radiationType: 'PHOTON', calculation: { doseDeviationPercent: 0.4 } }] }],
    };
    expect(StoredResult.parse(old).fractionGroups[0]!.beams[0]!.calculation!.doseDeviationPercent).toBe(0.4);
  });
  it('leaves out an explanation it cannot read, keeping the beam', () => {
    const odd = {
      planLabel: 'ODD',
      verdict: 'needs review',
      fullyVerified: true,
      fractionGroups: [{ beams: [{ status: 'checked', radiationType: 'PHOTON', explanation: { causes: 'not a list' } }] }],
    };
    const b = StoredResult.parse(odd).fractionGroups[0]!.beams[0]!;
    expect(b.explanation).toBeUndefined();
    expect(b.status).toBe('checked');
  });
  it('refuses a result whose verdict is not one of ours', () => {
    expect(StoredResult.safeParse({ planLabel: 'X', verdict: 'fine', fullyVerified: true, fractionGroups: [] }).success).toBe(false);
  });
});

describe('UserRecord', () => {
  const ok = { name: "Ann O'Neil-Smith", role: 'physicist', passwordHash: 'scrypt$16384$8$1$salt$hash', createdAt: '2026-12-01T00:00:00Z' };
  it('takes a name of letters, digits, spaces, dots, apostrophes and hyphens, and an scrypt hash', () => {
    expect(UserRecord.safeParse(ok).success).toBe(true);
    expect(UserRecord.safeParse({ ...ok, name: 'Zoë 2' }).success).toBe(true);
  });
  it('refuses a name with markup or control characters, an empty name, a plain password, another role', () => {
    for (const bad of [{ name: '<b>x</b>' }, { name: 'a\u001bb' }, { name: '' }, { passwordHash: 'secret' }, { role: 'admin' }])
      expect(UserRecord.safeParse({ ...ok, ...bad }).success).toBe(false);
  });
});
