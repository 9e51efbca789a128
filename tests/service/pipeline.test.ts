/**
 * The intake pipeline on the demo clinic: objects in the inbox grouped by frame of reference, checked
 * once settled (the pelvis plan with its own CT), recorded, archived by content hash; a second send of
 * the same plan is recognised and not checked twice; a file that is not DICOM goes to the refused folder.
 */
import { readdirSync, readFileSync, truncateSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { PlanKey } from '../../src/service/history/store.js';
import { processInbox } from '../../src/service/pipeline.js';
import { inboxNameFor } from '../../src/service/watch-folder.js';
import { clinic, put, setup } from '../helpers/inbox.js';
import { manifestPath } from '../helpers/machines.js';
import { writeVariant } from '../helpers/plan-variants.js';

const ctDir = manifestPath('fixtures/demo/clinic-ct/pelvis-box');

describe('the intake pipeline', () => {
  it('a CT without its plan waits; after the orphan time it is archived unchecked, and said so', async () => {
    const s = setup();
    for (const f of readdirSync(ctDir).slice(0, 3)) put(s.config.folders.inbox, join(ctDir, f));
    s.advance(3600);
    expect(await processInbox(s.ctx)).toMatchObject({ checked: 0, waiting: 3 });
    s.advance(72 * 3600);
    expect(await processInbox(s.ctx)).toMatchObject({ checked: 0, waiting: 0 });
    expect(s.lines.join('\n')).toMatch(/3 object\(s\) \(ct\) waited 72 h for a plan .*archived unchecked/);
  });

  it('waits for the settle time, then checks each plan with its CT, records it and archives every input by content hash', async () => {
    const s = setup();
    put(s.config.folders.inbox, clinic('pelvis-box.dcm'));
    put(s.config.folders.inbox, clinic('brain-laterals.dcm'));
    for (const f of readdirSync(ctDir)) put(s.config.folders.inbox, join(ctDir, f));
    expect(await processInbox(s.ctx)).toMatchObject({ checked: 0, waiting: 2 + readdirSync(ctDir).length });
    s.advance(31);
    expect(await processInbox(s.ctx)).toMatchObject({ checked: 2, duplicates: 0, refused: 0, waiting: 0 });
    expect(readdirSync(s.config.folders.inbox)).toEqual([]);
    const archived = readdirSync(s.config.folders.archive).flatMap((d) => readdirSync(join(s.config.folders.archive, d)));
    expect(archived).toHaveLength(2 + readdirSync(ctDir).length);
    expect(archived.every((f) => /^[0-9a-f]{64}\.dcm$/.test(f))).toBe(true);
    const checks = await s.history.listChecks();
    const pelvis = checks.find((c) => c.planLabel === 'PELVIS BOX')!;
    expect(pelvis.inputs.filter((i) => i.kind === 'ct')).toHaveLength(readdirSync(ctDir).length);
    // With its CT the pelvis plan is within tolerance (its planning system corrected for the bone).
    expect(pelvis.verdict).toBe('within tolerance');
    expect(await s.history.html(pelvis.id)).toMatch(/From the CT: SSD/);
    expect(await s.history.html(pelvis.id)).toMatch(/an aid to, never a replacement for/);
  });

  it('a second send of the same plan is archived without a second check; a non-DICOM file is refused with its reason', async () => {
    const s = setup();
    put(s.config.folders.inbox, clinic('spine-ssd.dcm'));
    s.advance(31);
    expect((await processInbox(s.ctx)).checked).toBe(1);
    put(s.config.folders.inbox, clinic('spine-ssd.dcm'));
    writeFileSync(join(s.config.folders.inbox, 'notes.txt'), 'not DICOM');
    s.advance(31);
    expect(await processInbox(s.ctx)).toMatchObject({ checked: 0, duplicates: 1, refused: 1 });
    expect(await s.history.listChecks()).toHaveLength(1);
    expect(readdirSync(s.config.folders.refused).sort()).toHaveLength(2);
    expect(s.lines.join('\n')).toMatch(/duplicate: plan .* was already checked/);
  });
});

describe('every plan ends as a record, whatever else is in the inbox', () => {
  it('100 plans behind two poison objects, a refused plan and a 2.2 GB sparse file: 100 checked, the rest recorded with reasons', async () => {
    const s = setup();
    const uid = (k: number, what: string) => `2.25.${what === 'sop' ? 1 : 2}${String(k).padStart(6, '0')}`;
    const plans = Array.from({ length: 102 }, (_, k) =>
      writeVariant('wedged-pair.dcm', (ds) => {
        ds.SOPInstanceUID = uid(k, 'sop');
        ds.FrameOfReferenceUID = uid(k, 'frame');
      }),
    );
    plans.forEach((f, k) => put(s.config.folders.inbox, f, `plan-${k}.dcm`));
    const refusedPlan = writeVariant('four-field-box.dcm', (ds) => {
      ds.SOPInstanceUID = '2.25.3';
      ds.FrameOfReferenceUID = '2.25.4';
      ds.FractionGroupSequence[0].ReferencedBeamSequence[0].BeamMeterset = -50;
    });
    put(s.config.folders.inbox, refusedPlan, 'negative-mu.dcm');
    const big = join(s.config.folders.inbox, 'huge.dcm');
    writeFileSync(big, '');
    truncateSync(big, 2.2e9); // sparse: no disk used, 2.2 GB by its size
    // Two poison objects: processing their groups throws (here, the history's lookup for those two plans).
    const poison = new Set([uid(7, 'sop'), uid(60, 'sop')]);
    const history = new Proxy(s.history, {
      get(target, prop, receiver) {
        if (prop === 'alreadyChecked')
          return async (key: PlanKey) => {
            const sop = key.sopInstanceUid;
            if (poison.has(sop)) throw new Error('poisoned for the test');
            return target.alreadyChecked(key);
          };
        const v = Reflect.get(target, prop, receiver);
        return typeof v === 'function' ? v.bind(target) : v;
      },
    });
    s.advance(60);
    const round = await processInbox({ ...s.ctx, history });
    expect(round).toMatchObject({ checked: 100, waiting: 0 });
    expect(await s.history.listChecks()).toHaveLength(100);
    const outcomes = await s.history.intakeOutcomes();
    expect(
      outcomes
        .filter((o) => o.outcome === 'failed')
        .map((o) => o.sopInstanceUid)
        .sort(),
    ).toEqual([...poison].sort());
    expect(
      outcomes
        .filter((o) => o.outcome === 'refused')
        .map((o) => o.fileName)
        .sort(),
    ).toEqual(['huge.dcm', 'negative-mu.dcm']);
    expect(outcomes.find((o) => o.fileName === 'huge.dcm')!.reason).toMatch(/larger than the largest object accepted/);
    expect(readdirSync(s.config.folders.inbox)).toEqual([]);
    // Each set-aside file kept under a new name beside a note naming the original and the reason.
    const notes = readdirSync(s.config.folders.refused).filter((f) => f.endsWith('.txt'));
    expect(notes).toHaveLength(4);
  });
});

describe('a file still being written', () => {
  it('is refused only once it has been still for the settle time, under the name it was exported with', async () => {
    const s = setup();
    const name = inboxNameFor('/export/RP.half.dcm');
    writeFileSync(join(s.config.folders.inbox, name), readFileSync(clinic('brain-laterals.dcm')).subarray(0, 300));
    expect((await processInbox(s.ctx)).refused).toBe(0);
    expect(readdirSync(s.config.folders.inbox)).toEqual([name]);
    s.advance(60);
    expect((await processInbox(s.ctx)).refused).toBe(1);
    expect(await s.history.intakeOutcomes()).toEqual([expect.objectContaining({ outcome: 'refused', fileName: 'RP.half.dcm' })]);
  });
});

describe('a plan the check itself refuses', () => {
  it('a machine no beam data know is recorded as refused, as the command line refuses it, not as a check', async () => {
    const s = setup();
    const f = writeVariant('four-field-box.dcm', (ds) => {
      for (const b of ds.BeamSequence) b.TreatmentMachineName = 'NO_SUCH_LINAC';
    });
    put(s.config.folders.inbox, f, 'unknown-machine.dcm');
    s.advance(60);
    expect(await processInbox(s.ctx)).toMatchObject({ checked: 0, refused: 1 });
    expect(await s.history.listChecks()).toEqual([]);
    expect(await s.history.intakeOutcomes()).toEqual([
      expect.objectContaining({ outcome: 'refused', fileName: 'unknown-machine.dcm', reason: expect.stringMatching(/NO_SUCH_LINAC/) }),
    ]);
    // Advice the service's user can follow (it has no command line): the beam data's aliases first.
    expect((await s.history.intakeOutcomes())[0]!.reason).toMatch(/add "NO_SUCH_LINAC" to the aliases in its manifest/);
  });
});

describe('two plans of one frame of reference, one of them poisoned', () => {
  it('the good one is checked and archived, the poisoned one alone recorded as failed', async () => {
    const s = setup();
    for (const sop of ['2.25.71', '2.25.72'])
      put(
        s.config.folders.inbox,
        writeVariant('wedged-pair.dcm', (ds) => {
          ds.SOPInstanceUID = sop;
          ds.FrameOfReferenceUID = '2.25.70';
        }),
        `${sop}.dcm`,
      );
    const history = new Proxy(s.history, {
      get(target, prop, receiver) {
        if (prop === 'alreadyChecked')
          return async (key: PlanKey) => {
            const sop = key.sopInstanceUid;
            if (sop === '2.25.72') throw new Error('poisoned for the test');
            return target.alreadyChecked(key);
          };
        const v = Reflect.get(target, prop, receiver);
        return typeof v === 'function' ? v.bind(target) : v;
      },
    });
    s.advance(60);
    expect(await processInbox({ ...s.ctx, history })).toMatchObject({ checked: 1, refused: 1 });
    expect((await s.history.listChecks()).map((c) => c.planSopInstanceUid)).toEqual(['2.25.71']);
    expect((await s.history.intakeOutcomes()).map((o) => [o.outcome, o.sopInstanceUid])).toEqual([['failed', '2.25.72']]);
    expect(readdirSync(s.config.folders.inbox)).toEqual([]);
  });
});
