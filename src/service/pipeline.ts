import { createHash, randomUUID } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync, existsSync } from 'node:fs';
import { join } from 'node:path';
import {
  beamDataStamp,
  checkArrivedPlan,
  checkDocument,
  type LoadedMachine,
  loadCompanions,
  type ObjectSummary,
  type Policy,
  readObjectSummary,
  VERSION,
} from '../run/index.js';
import { checkHtml } from '../report/check-html.js';
import { planHeadline } from '../report/plan-headline.js';
import type { ServiceConfig } from './config.js';
import type { CheckInput, HistoryStore } from './history/store.js';

export interface PipelineContext {
  readonly config: ServiceConfig;
  readonly machines: readonly [LoadedMachine, ...LoadedMachine[]];
  readonly policy: Policy;
  readonly history: HistoryStore;
  readonly log: (line: string) => void;
  /** Milliseconds since the epoch (a parameter, so tests need not wait). */
  readonly now: () => number;
}

export interface PipelineRound {
  readonly checked: number;
  readonly duplicates: number;
  readonly refused: number;
  /** Objects left in the inbox: their group is still settling, or has no plan yet (for up to `orphanHours`). */
  readonly waiting: number;
}

interface Entry {
  readonly file: string;
  readonly summary: ObjectSummary;
  readonly sha256: string;
  readonly mtimeMs: number;
}

/**
 * One pass over the inbox: objects grouped by frame of reference (else study); a group whose last
 * object arrived more than the settle time ago and that holds a plan is checked — with its CT,
 * structures and dose when present — recorded, and moved to the archive. A plan already checked
 * (same SOP instance UID and content) is archived without a second check. Files are named by their
 * content hash, never by anything inside them. Idempotent: after a crash, the next pass redoes
 * only what was not recorded.
 */
export function processInbox(ctx: PipelineContext): PipelineRound {
  const { inbox } = ctx.config.folders;
  mkdirSync(inbox, { recursive: true });
  let refused = 0;
  const entries: Entry[] = [];
  for (const name of readdirSync(inbox)) {
    if (name.startsWith('.')) continue;
    const file = join(inbox, name);
    const st = statSync(file, { throwIfNoEntry: false });
    if (!st?.isFile()) continue;
    const s = readObjectSummary(file);
    if (!s.ok) {
      refuse(ctx, file, s.issues.map((i) => i.message).join('; '));
      refused++;
      continue;
    }
    entries.push({ file, summary: s.value, sha256: sha256Of(file), mtimeMs: st.mtimeMs });
  }
  const groups = new Map<string, Entry[]>();
  for (const e of entries) {
    const key = e.summary.frameOfReferenceUid ?? e.summary.studyInstanceUid ?? e.summary.sopInstanceUid;
    groups.set(key, [...(groups.get(key) ?? []), e]);
  }
  let checked = 0;
  let duplicates = 0;
  let waiting = 0;
  for (const group of groups.values()) {
    const quietMs = ctx.now() - Math.max(...group.map((e) => e.mtimeMs));
    const settled = quietMs >= ctx.config.settleSeconds * 1000;
    const plans = group.filter((e) => e.summary.kind === 'plan');
    if (plans.length === 0 && quietMs >= ctx.config.orphanHours * 3_600_000) {
      ctx.log(
        `${group.length} object(s) (${[...new Set(group.map((e) => e.summary.kind))].join(', ')}) waited ${ctx.config.orphanHours} h for a plan in ` +
          `their frame of reference: archived unchecked`,
      );
      for (const e of group) archive(ctx, e);
      continue;
    }
    if (!settled || plans.length === 0) {
      waiting += group.length;
      continue;
    }
    const r = checkGroup(ctx, group, plans);
    checked += r.checked;
    duplicates += r.duplicates;
    refused += r.refused;
    for (const e of group) archive(ctx, e);
  }
  return { checked, duplicates, refused, waiting };
}

function checkGroup(
  ctx: PipelineContext,
  group: readonly Entry[],
  plans: readonly Entry[],
): { checked: number; duplicates: number; refused: number } {
  const of = (kind: string) => group.filter((e) => e.summary.kind === kind).map((e) => e.file);
  const companions = loadCompanions({ ctFiles: of('ct'), structuresFile: of('structures')[0], doseFiles: of('dose') }, ctx.config.ct, ctx.policy);
  let checked = 0;
  let duplicates = 0;
  let refused = 0;
  for (const p of plans) {
    if (ctx.history.alreadyChecked(p.summary.sopInstanceUid, p.sha256)) {
      ctx.log(`duplicate: plan ${p.summary.sopInstanceUid} (sha256 ${p.sha256.slice(0, 12)}…) was already checked; archived`);
      duplicates++;
      continue;
    }
    const r = checkArrivedPlan(readFileSync(p.file), p.file, p.sha256, ctx.machines, ctx.policy, companions);
    if (!r.ok) {
      ctx.log(`refused plan ${p.summary.sopInstanceUid}: ${r.issues.map((i) => i.message).join('; ')}`);
      refused++;
      continue;
    }
    const { result, machine } = r.value;
    const recordedAt = new Date(ctx.now());
    const stamp = beamDataStamp(machine);
    const doc = checkDocument([result], [], stamp, ctx.policy, recordedAt);
    const inputs: CheckInput[] = group
      .filter((e) => e.summary.kind !== 'plan' || e === p)
      .map((e) => ({ kind: e.summary.kind, sopInstanceUid: e.summary.sopInstanceUid, sha256: e.sha256 }));
    const id = ctx.history.recordCheck({
      recordedAt: recordedAt.toISOString(),
      result,
      planSha256: p.sha256,
      toolVersion: VERSION,
      beamDataVersion: stamp.dataVersion,
      beamDataSha256: stamp.sha256,
      inputs,
      html: checkHtml(doc),
    });
    ctx.log(`checked plan "${result.planLabel}" (check ${id}): ${planHeadline(result)}`);
    checked++;
  }
  return { checked, duplicates, refused };
}

/** Into archive/<date>/<sha256>.dcm; a second copy of the same content is simply removed. */
function archive(ctx: PipelineContext, e: Entry): void {
  const dir = join(ctx.config.folders.archive, new Date(ctx.now()).toISOString().slice(0, 10));
  mkdirSync(dir, { recursive: true });
  const target = join(dir, `${e.sha256}.dcm`);
  if (existsSync(target)) rmSync(e.file);
  else renameSync(e.file, target);
}

function refuse(ctx: PipelineContext, file: string, why: string): void {
  const dir = ctx.config.folders.refused;
  mkdirSync(dir, { recursive: true });
  const name = `${randomUUID()}`;
  renameSync(file, join(dir, `${name}.bin`));
  writeFileSync(join(dir, `${name}.txt`), `${why}\n`);
  ctx.log(`refused a file: ${why}`);
}

function sha256Of(file: string): string {
  return createHash('sha256').update(readFileSync(file)).digest('hex');
}
