import { createHash, randomUUID } from 'node:crypto';
import { mkdirSync, readdirSync, readFileSync, renameSync, rmSync, statSync, writeFileSync, existsSync } from 'node:fs';
import { basename, join } from 'node:path';
import {
  beamDataStamp,
  checkArrivedPlan,
  checkDocument,
  datasetSha256,
  type LoadedMachine,
  loadCompanions,
  planContentSha256,
  type ObjectSummary,
  type Policy,
  readObjectSummary,
  VERSION,
} from '../run/index.js';
import { checkHtml } from '../report/check-html.js';
import { planHeadline } from '../report/plan-headline.js';
import type { Issue } from '../model/index.js';
import type { ServiceConfig } from './config.js';
import type { CheckInput, HistoryStore } from './history/store.js';
import { arrivalOf } from './inbox-names.js';

export interface PipelineContext {
  readonly config: ServiceConfig;
  readonly machines: readonly [LoadedMachine, ...LoadedMachine[]];
  readonly policy: Policy;
  readonly history: HistoryStore;
  readonly log: (line: string) => void;
  /** Milliseconds since the epoch (a parameter, so tests need not wait). */
  readonly now: () => number;
  /** What earlier passes read of each inbox file, kept while its name, size and time stay the same. */
  readonly seen?: Map<string, Entry>;
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
  readonly size: number;
  readonly summary: ObjectSummary;
  /** The file's SHA-256 (its archive name). */
  readonly sha256: string;
  /**
   * The hash recorded: for an object received over the network, its data set as sent (the receiver
   * wrote the file meta group); for a file taken from the watched folder, the exported file's.
   */
  readonly sentSha256: string;
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
export async function processInbox(ctx: PipelineContext): Promise<PipelineRound> {
  const { inbox } = ctx.config.folders;
  mkdirSync(inbox, { recursive: true });
  let refused = 0;
  const entries: Entry[] = [];
  const names = readdirSync(inbox);
  for (const name of names) {
    if (name.startsWith('.')) continue;
    const e = entryOf(ctx, join(inbox, name));
    if (e === undefined) continue;
    if ('reason' in e) {
      await ctx.history.recordIntakeOutcome({
        recordedAt: new Date(ctx.now()).toISOString(),
        outcome: 'refused',
        ...sender(name),
        reason: e.reason,
      });
      setAside(ctx, [join(inbox, name)], e.reason, 'refused');
      refused++;
    } else entries.push(e);
  }
  for (const k of ctx.seen?.keys() ?? []) if (!names.includes(k)) ctx.seen!.delete(k);
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
    // Each plan's failure is its own record (checkGroup); one here (the companions unreadable) is the
    // group's, recorded for each of its plans: either way the pass goes on with the next group.
    let r: Awaited<ReturnType<typeof checkGroup>>;
    try {
      r = await checkGroup(ctx, group, plans);
    } catch (err) {
      for (const p of plans) await recordOutcome(ctx, p, 'failed', failedReason(err));
      setAside(ctx, group.map((e) => e.file).filter(existsSync), failedReason(err), 'failed');
      refused += plans.length;
      continue;
    }
    checked += r.checked;
    duplicates += r.duplicates;
    refused += r.refused;
    for (const e of group) if (!r.setAside.has(e)) archive(ctx, e);
  }
  return { checked, duplicates, refused, waiting };
}

/**
 * An inbox file as an entry (read and hashed once while its name, size and time stay the same),
 * the reason it is refused, or undefined for what is no regular file (or is gone).
 */
function entryOf(ctx: PipelineContext, file: string): Entry | { reason: string } | undefined {
  const st = statSync(file, { throwIfNoEntry: false });
  if (!st?.isFile()) return undefined;
  const name = basename(file);
  const known = ctx.seen?.get(name);
  if (known && known.size === st.size && known.mtimeMs === st.mtimeMs) return known;
  const limit = ctx.config.maxObjectBytes;
  if (st.size > limit) return { reason: `${st.size} bytes, larger than the largest object accepted (${limit} bytes, maxObjectBytes): not read` };
  // A file still being written reads as broken: refused only once it has been still for the settle time.
  const settling = ctx.now() - st.mtimeMs < ctx.config.settleSeconds * 1000;
  try {
    const s = readObjectSummary(file);
    if (!s.ok) return settling ? undefined : { reason: reasonOf(s.issues) };
    const bytes = readFileSync(file);
    const sha256 = createHash('sha256').update(bytes).digest('hex');
    const sentSha256 = arrivalOf(name).received ? datasetSha256(bytes) : sha256;
    const e: Entry = { file, size: st.size, summary: s.value, sha256, sentSha256, mtimeMs: st.mtimeMs };
    ctx.seen?.set(name, e);
    return e;
  } catch (err) {
    return settling ? undefined : { reason: `cannot be read (${(err as NodeJS.ErrnoException).code ?? String(err)})` };
  }
}

/**
 * A settled group's plans, each on its own: checked and recorded, a duplicate, or set aside as
 * refused (its input) or failed (an error of ours while checking it), each with its record.
 */
async function checkGroup(
  ctx: PipelineContext,
  group: readonly Entry[],
  plans: readonly Entry[],
): Promise<{ checked: number; duplicates: number; refused: number; setAside: Set<Entry> }> {
  const of = (kind: string) => group.filter((e) => e.summary.kind === kind).map((e) => e.file);
  const companions = loadCompanions({ ctFiles: of('ct'), structuresFile: of('structures')[0], doseFiles: of('dose') }, ctx.config.ct, ctx.policy);
  const tally = { checked: 0, duplicates: 0, refused: 0, setAside: new Set<Entry>() };
  for (const p of plans) {
    let outcome: PlanOutcome;
    try {
      outcome = await checkOnePlan(ctx, group, p, companions);
    } catch (err) {
      outcome = { failed: failedReason(err) };
    }
    if (outcome === 'checked') tally.checked++;
    else if (outcome === 'duplicate') tally.duplicates++;
    else {
      // Acknowledged to the sender, so never dropped: recorded with its reason, the file kept beside it.
      const [kind, reason] = 'refused' in outcome ? (['refused', outcome.refused] as const) : (['failed', outcome.failed] as const);
      await recordOutcome(ctx, p, kind, reason);
      setAside(ctx, [p.file], reason, kind);
      tally.setAside.add(p);
      tally.refused++;
    }
  }
  return tally;
}

const failedReason = (err: unknown): string =>
  `the check failed (an error of plumbline's, not of the plan): ${(err as Error)?.message ?? String(err)}`;

type PlanOutcome = 'checked' | 'duplicate' | { readonly refused: string } | { readonly failed: string };

/**
 * One plan, alone across every node sharing the history: a plan another node recorded meanwhile is
 * a duplicate, archived without a second check; else checked and recorded once.
 */
async function checkOnePlan(
  ctx: PipelineContext,
  group: readonly Entry[],
  p: Entry,
  companions: ReturnType<typeof loadCompanions>,
): Promise<PlanOutcome> {
  const bytes = readFileSync(p.file);
  const content = planContentSha256(bytes, p.file);
  const key = { sopInstanceUid: p.summary.sopInstanceUid, sha256: p.sentSha256, contentSha256: content };
  return ctx.history.exclusively(key, async () => {
    if (await ctx.history.alreadyChecked(key)) return duplicate(ctx, p);
    return checkAndRecord(ctx, group, p, companions, bytes, content);
  });
}

function duplicate(ctx: PipelineContext, p: Entry): 'duplicate' {
  ctx.log(`duplicate: plan ${p.summary.sopInstanceUid} (sha256 ${p.sha256.slice(0, 12)}…) was already checked; archived`);
  return 'duplicate';
}

async function checkAndRecord(
  ctx: PipelineContext,
  group: readonly Entry[],
  p: Entry,
  companions: ReturnType<typeof loadCompanions>,
  bytes: Buffer,
  content: string | undefined,
): Promise<PlanOutcome> {
  const r = checkArrivedPlan(bytes, p.file, p.sentSha256, ctx.machines, ctx.policy, companions);
  if (!r.ok) return { refused: reasonOf(r.issues) };
  const { result, machine } = r.value;
  // Refused by the check itself (a machine the beam data do not know, a field beyond the machine): as the CLI refuses it.
  if (result.issues.length) return { refused: reasonOf(result.issues) };
  const recordedAt = new Date(ctx.now());
  const stamp = beamDataStamp(machine);
  const doc = checkDocument([result], [], stamp, ctx.policy, recordedAt);
  const inputs: CheckInput[] = group
    .filter((e) => e.summary.kind !== 'plan' || e === p)
    .map((e) => ({ kind: e.summary.kind, sopInstanceUid: e.summary.sopInstanceUid, sha256: e.sentSha256 }));
  const id = await ctx.history.recordCheck({
    recordedAt: recordedAt.toISOString(),
    result,
    planSha256: p.sentSha256,
    ...(content ? { planContentSha256: content } : {}),
    toolVersion: VERSION,
    beamDataVersion: stamp.dataVersion,
    beamDataSha256: stamp.sha256,
    inputs,
    html: checkHtml(doc),
  });
  // Recorded by another writer between our look and our insert (the database's unique key): one record
  // stays, and the check made here was made twice — said, since `exclusively` should have kept it from happening.
  if (id === undefined) {
    ctx.log(`duplicate: plan ${p.summary.sopInstanceUid} was recorded by another node while it was checked here; archived`);
    return 'duplicate';
  }
  ctx.log(`checked plan "${result.planLabel}" (check ${id}): ${planHeadline(result)}`);
  return 'checked';
}

/** Into archive/<date>/<sha256>.dcm; a second copy of the same content is simply removed. */
function archive(ctx: PipelineContext, e: Entry): void {
  const dir = join(ctx.config.folders.archive, new Date(ctx.now()).toISOString().slice(0, 10));
  mkdirSync(dir, { recursive: true });
  const target = join(dir, `${e.sha256}.dcm`);
  if (existsSync(target)) rmSync(e.file);
  else renameSync(e.file, target);
  ctx.seen?.delete(basename(e.file));
}

/** Into refused/: each file under a new name, with a note of its original name and the reason; the refusal logged. */
function setAside(ctx: PipelineContext, files: readonly string[], why: string, outcome: 'refused' | 'failed'): void {
  const dir = ctx.config.folders.refused;
  mkdirSync(dir, { recursive: true });
  for (const file of files) {
    const name = randomUUID();
    renameSync(file, join(dir, `${name}.bin`));
    writeFileSync(join(dir, `${name}.txt`), `${outcome}: ${describe(basename(file))}\n${why}\n`);
    ctx.seen?.delete(basename(file));
    ctx.log(`${outcome} ${describe(basename(file))} (kept as ${name}.bin): ${why}`);
  }
}

/** A plan that arrived and was not checked, in the history with the reason. */
async function recordOutcome(ctx: PipelineContext, p: Entry, outcome: 'refused' | 'failed', reason: string): Promise<void> {
  await ctx.history.recordIntakeOutcome({
    recordedAt: new Date(ctx.now()).toISOString(),
    outcome,
    ...sender(basename(p.file)),
    sopInstanceUid: p.summary.sopInstanceUid,
    sha256: p.sentSha256,
    reason,
  });
}

/** The file name and sender an intake record keeps of an inbox file. */
function sender(inboxName: string): { fileName: string; callingAeTitle?: string } {
  const a = arrivalOf(inboxName);
  return { fileName: a.fileName, ...(a.callingAeTitle !== undefined ? { callingAeTitle: a.callingAeTitle } : {}) };
}

/** An inbox file in words: the exported file's name, or the received object's sender. */
function describe(inboxName: string): string {
  const a = arrivalOf(inboxName);
  return a.callingAeTitle !== undefined ? `${a.fileName} (from AE title ${a.callingAeTitle})` : a.fileName;
}

/** The reason of a refusal: each message once (the same problem of several beams is one reason). */
function reasonOf(issues: readonly Pick<Issue, 'message'>[]): string {
  return [...new Set(issues.map((i) => i.message))].join('; ');
}
