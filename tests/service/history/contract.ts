/**
 * One contract for every history store: the same inserts, queries, duplicate keys, append-only
 * refusals, review records and intake outcomes, run against SQLite and against a real PostgreSQL
 * server. `raw` runs a statement as any other client of the database would, outside the store.
 */
import { describe, expect, it } from 'vitest';
import type { HistoryStore, NewCheck } from '../../../src/service/history/store.js';
import { check, importOrThrow } from '../../helpers/check-run.js';
import { DEMO_MANIFEST, machine, manifestPath } from '../../helpers/machines.js';

const demo = machine(DEMO_MANIFEST);
const brain = check(importOrThrow(manifestPath('fixtures/demo/clinic/brain-laterals.dcm')), demo);
const breast = check(importOrThrow(manifestPath('fixtures/demo/clinic/breast-tangents.dcm')), demo);

export const newCheck = (over: Partial<NewCheck> = {}): NewCheck => ({
  recordedAt: '2026-12-01T10:00:00.000Z',
  result: brain,
  planSha256: 'a'.repeat(64),
  planContentSha256: 'c'.repeat(64),
  toolVersion: 'test',
  inputs: [{ kind: 'plan', sopInstanceUid: brain.sopInstanceUid, sha256: 'a'.repeat(64) }],
  html: '<p>report</p>',
  ...over,
});

export interface StoreUnderTest {
  /** A new, empty store, and the same history opened again (another node, or a restart). */
  readonly open: () => Promise<{ store: HistoryStore; reopen: () => Promise<HistoryStore>; raw: (sql: string) => Promise<unknown> }>;
}

export function historyContract(name: string, t: StoreUnderTest): void {
  describe(`the history store contract: ${name}`, () => {
    it('applies its migrations once, recorded: schema version 7, again after reopening', async () => {
      const { store, reopen } = await t.open();
      expect(await store.schemaVersion()).toBe(7);
      await store.recordCheck(newCheck());
      const again = await reopen();
      expect(await again.schemaVersion()).toBe(7);
      expect(await again.listChecks()).toHaveLength(1);
      await again.close();
      await store.close();
    });

    it('keeps every check with its inputs, full result and page; lists it by number, date, verdict and machine', async () => {
      const { store } = await t.open();
      const id = (await store.recordCheck(newCheck()))!;
      const later = (await store.recordCheck(
        newCheck({ recordedAt: '2026-12-02T10:00:00.000Z', result: breast, planSha256: 'b'.repeat(64), planContentSha256: 'd'.repeat(64) }),
      ))!;
      const all = await store.listChecks();
      expect(all.map((c) => c.id)).toEqual([later, id]);
      expect(all[1]).toMatchObject({ id, planLabel: 'BRAIN LATS', verdict: brain.verdict, fullyVerified: true, machine: 'NG_LINAC1' });
      expect(all[1]!.inputs).toEqual([{ kind: 'plan', sopInstanceUid: brain.sopInstanceUid, sha256: 'a'.repeat(64) }]);
      expect((await store.result(id))!.fractionGroups.flatMap((g) => g.beams)).toHaveLength(2);
      expect(await store.html(id)).toBe('<p>report</p>');
      expect(await store.result(999_999)).toBeUndefined();
      expect((await store.listChecks({ id })).map((c) => c.id)).toEqual([id]);
      expect((await store.listChecks({ since: '2026-12-02' })).map((c) => c.id)).toEqual([later]);
      expect((await store.listChecks({ verdicts: [breast.verdict] })).map((c) => c.id)).toEqual([later]);
      expect(await store.listChecks({ machine: 'ANOTHER' })).toEqual([]);
      await store.close();
    });

    it('lists the checks that want a physicist and have no review yet, oldest first', async () => {
      const { store } = await t.open();
      const fine = (await store.recordCheck(newCheck()))!; // brain laterals: within tolerance, fully verified
      const flagged = (await store.recordCheck(
        newCheck({ recordedAt: '2026-12-02T10:00:00.000Z', result: breast, planSha256: 'b'.repeat(64), planContentSha256: 'd'.repeat(64) }),
      ))!;
      const partly = (await store.recordCheck(
        newCheck({
          recordedAt: '2026-12-01T09:00:00.000Z',
          result: { ...brain, sopInstanceUid: '2.25.9', fullyVerified: false },
          planSha256: 'e'.repeat(64),
          planContentSha256: 'f'.repeat(64),
        }),
      ))!;
      expect(brain.verdict).toBe('within tolerance');
      expect((await store.listChecks({ needingReview: true, unreviewed: true, oldestFirst: true })).map((c) => c.id)).toEqual([partly, flagged]);
      await store.addReview({ checkId: partly, reviewer: 'Physicist A', reviewedAt: '2026-12-03T00:00:00.000Z', accepted: true, comment: '' });
      expect((await store.listChecks({ needingReview: true, unreviewed: true })).map((c) => c.id)).toEqual([flagged]);
      expect((await store.listChecks({ oldestFirst: true })).map((c) => c.id)).toEqual([partly, fine, flagged]);
      await store.close();
    });

    it('finds a plan already checked by its SOP instance and file or content hash; records it only once', async () => {
      const { store } = await t.open();
      await store.recordCheck(newCheck());
      const sop = brain.sopInstanceUid;
      expect(await store.alreadyChecked({ sopInstanceUid: sop, sha256: 'a'.repeat(64) })).toBe(true);
      expect(await store.alreadyChecked({ sopInstanceUid: sop, sha256: 'e'.repeat(64), contentSha256: 'c'.repeat(64) })).toBe(true);
      expect(await store.alreadyChecked({ sopInstanceUid: sop, sha256: 'e'.repeat(64), contentSha256: 'f'.repeat(64) })).toBe(false);
      expect(await store.alreadyChecked({ sopInstanceUid: '2.25.1', sha256: 'a'.repeat(64) })).toBe(false);
      // The same plan again (another node that did not look first): the database's unique key keeps one record.
      expect(await store.recordCheck(newCheck({ recordedAt: '2026-12-03T00:00:00.000Z' }))).toBeUndefined();
      expect(await store.recordCheck(newCheck({ planSha256: 'e'.repeat(64) }))).toBeUndefined();
      expect(await store.listChecks()).toHaveLength(1);
      await store.close();
    });

    it('refuses any change or removal of a record from any client of the database', async () => {
      const { store, raw } = await t.open();
      const id = (await store.recordCheck(newCheck()))!;
      await store.addReview({ checkId: id, reviewer: 'Physicist R', reviewedAt: '2026-12-02T08:00:00.000Z', accepted: true, comment: '' });
      await store.recordIntakeOutcome({ recordedAt: '2026-12-02T08:00:00.000Z', outcome: 'refused', fileName: 'x.dcm', reason: 'test' });
      for (const [table, column] of [
        ['checks', 'verdict'],
        ['reviews', 'reviewer'],
        ['intake_outcomes', 'reason'],
      ]) {
        await expect(raw(`UPDATE ${table} SET ${column} = 'x'`), table).rejects.toThrow(/append-only/);
        await expect(raw(`DELETE FROM ${table}`), table).rejects.toThrow(/append-only/);
      }
      expect(await store.listChecks()).toHaveLength(1);
      expect(await store.reviews(id)).toHaveLength(1);
      expect(await store.intakeOutcomes()).toHaveLength(1);
      await store.close();
    });

    it('a review is a new record, in order; a second does not replace the first; a review without a reviewer is refused', async () => {
      const { store } = await t.open();
      const id = (await store.recordCheck(newCheck()))!;
      await store.addReview({
        checkId: id,
        reviewer: 'Physicist A',
        reviewedAt: '2026-12-02T09:00:00.000Z',
        accepted: false,
        comment: 'check the point',
      });
      await store.addReview({
        checkId: id,
        reviewer: 'Physicist B',
        reviewerRole: 'physicist',
        reviewedAt: '2026-12-02T10:00:00.000Z',
        accepted: true,
        comment: '',
      });
      expect((await store.reviews(id)).map((r) => [r.reviewer, r.reviewerRole, r.accepted, r.comment])).toEqual([
        ['Physicist A', undefined, false, 'check the point'],
        ['Physicist B', 'physicist', true, ''],
      ]);
      await expect(store.addReview({ checkId: id, reviewer: '', reviewedAt: 'x', accepted: true, comment: '' })).rejects.toThrow();
      await expect(store.addReview({ checkId: 999_999, reviewer: 'X', reviewedAt: 'x', accepted: true, comment: '' })).rejects.toThrow();
      await store.close();
    });

    it('keeps every object refused or failed at intake, newest first, from a date on', async () => {
      const { store } = await t.open();
      await store.recordIntakeOutcome({ recordedAt: '2026-12-01T08:00:00.000Z', outcome: 'refused', fileName: 'a.dcm', reason: 'not DICOM' });
      await store.recordIntakeOutcome({
        recordedAt: '2026-12-02T08:00:00.000Z',
        outcome: 'failed',
        fileName: 'b.dcm',
        sopInstanceUid: '2.25.5',
        sha256: 'f'.repeat(64),
        reason: 'ours',
      });
      expect((await store.intakeOutcomes()).map((o) => o.fileName)).toEqual(['b.dcm', 'a.dcm']);
      expect(await store.intakeOutcomes('2026-12-02')).toEqual([
        expect.objectContaining({ outcome: 'failed', fileName: 'b.dcm', sopInstanceUid: '2.25.5', reason: 'ours' }),
      ]);
      await store.close();
    });

    it('keeps accounts by name, refuses a second account of the same name, and changes a password', async () => {
      const { store } = await t.open();
      const u = {
        name: 'Physicist A',
        role: 'physicist' as const,
        passwordHash: 'scrypt$16384$8$1$c2FsdA==$a2V5',
        createdAt: '2026-12-01T00:00:00.000Z',
      };
      expect(await store.addUser(u)).toBe(true);
      expect(await store.addUser({ ...u, role: 'viewer' })).toBe(false);
      expect(await store.user('Physicist A')).toEqual(u);
      expect(await store.user('Nobody')).toBeUndefined();
      expect(await store.setPassword('Physicist A', 'scrypt$16384$8$1$c2FsdA==$bmV3')).toBe(true);
      expect((await store.user('Physicist A'))!.passwordHash).toBe('scrypt$16384$8$1$c2FsdA==$bmV3');
      expect(await store.setPassword('Nobody', 'scrypt$x')).toBe(false);
      await expect(store.addUser({ ...u, name: 'B', role: 'admin' as never })).rejects.toThrow();
      expect((await store.users()).map((x) => x.name)).toEqual(['Physicist A']);
      await store.close();
    });

    it("works on one plan at a time: a second worker on the same plan waits and then sees the first one's record", async () => {
      const { store } = await t.open();
      const key = { sopInstanceUid: brain.sopInstanceUid, sha256: 'a'.repeat(64) };
      const order: string[] = [];
      const first = store.exclusively(key, async () => {
        order.push('first in');
        await new Promise((r) => setTimeout(r, 100));
        await store.recordCheck(newCheck());
        order.push('first out');
      });
      const second = store.exclusively(key, async () => {
        order.push(`second in, already checked: ${await store.alreadyChecked(key)}`);
      });
      await Promise.all([first, second]);
      expect(order).toEqual(['first in', 'first out', 'second in, already checked: true']);
      // A worker that fails releases the plan.
      await expect(store.exclusively(key, async () => Promise.reject(new Error('boom')))).rejects.toThrow('boom');
      expect(await store.exclusively(key, async () => 'free')).toBe('free');
      await store.close();
    });
  });
}
