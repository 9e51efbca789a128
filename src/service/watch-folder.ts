import { randomUUID } from 'node:crypto';
import { closeSync, copyFileSync, fsyncSync, mkdirSync, openSync, readdirSync, renameSync, rmSync, statSync, utimesSync } from 'node:fs';
import { join } from 'node:path';
import { inboxNameFor } from './inbox-names.js';

export { inboxNameFor, originalName } from './inbox-names.js';

export interface WatchState {
  /** Per file seen: its size and modification time at the last look, and since when they have not changed. */
  readonly seen: Map<string, { size: number; mtimeMs: number; stableSinceMs: number }>;
  /** Hidden files already said to be left alone (said once each). */
  readonly told?: Set<string>;
}

/**
 * One look at a watched export folder (and its subfolders): a file is taken only once its size and
 * modification time have stayed the same for `stableMs` (the exporter has finished writing it); it
 * is then moved into the inbox under a new name (copied, fsynced and renamed when the two folders are
 * on different file systems). Returns the number of files taken.
 */
export function takeStableFiles(
  folder: string,
  inbox: string,
  state: WatchState,
  nowMs: number,
  stableMs: number,
  log: (line: string) => void = () => {},
): number {
  let taken = 0;
  const present = new Set<string>();
  const { files, hidden } = listFiles(folder);
  for (const h of hidden)
    if (!state.told?.has(h)) {
      state.told?.add(h);
      log(`watch: ${h} is hidden (its name starts with a dot): left in the export folder, not taken`);
    }
  for (const file of files) {
    const st = statSync(file, { throwIfNoEntry: false });
    if (!st?.isFile()) continue;
    present.add(file);
    const before = state.seen.get(file);
    if (!before || before.size !== st.size || before.mtimeMs !== st.mtimeMs) {
      state.seen.set(file, { size: st.size, mtimeMs: st.mtimeMs, stableSinceMs: nowMs });
      continue;
    }
    // Our own observation only: a file dated in the future (a clock elsewhere) is taken once it stops changing.
    if (nowMs - before.stableSinceMs < stableMs) continue;
    moveInto(file, inbox);
    state.seen.delete(file);
    taken++;
  }
  for (const f of state.seen.keys()) if (!present.has(f)) state.seen.delete(f);
  return taken;
}

function listFiles(dir: string, out = { files: [] as string[], hidden: [] as string[] }): { files: string[]; hidden: string[] } {
  for (const e of readdirSync(dir, { withFileTypes: true })) {
    const p = join(dir, e.name);
    if (e.name.startsWith('.')) out.hidden.push(p);
    else if (e.isDirectory()) listFiles(p, out);
    else if (e.isFile()) out.files.push(p);
  }
  return out;
}

/** Into the inbox atomically: the pipeline never sees half a file. */
function moveInto(file: string, inbox: string): void {
  const incoming = join(inbox, '.incoming');
  mkdirSync(incoming, { recursive: true });
  const tmp = join(incoming, `${randomUUID()}.part`);
  try {
    renameSync(file, tmp);
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code !== 'EXDEV') throw e;
    copyFileSync(file, tmp);
    const fd = openSync(tmp, 'r');
    try {
      fsyncSync(fd);
    } finally {
      closeSync(fd);
    }
    rmSync(file);
  }
  // Arrival time, not the export's: the settle time counts from when the object reached the inbox.
  const now = new Date();
  utimesSync(tmp, now, now);
  renameSync(tmp, join(inbox, inboxNameFor(file)));
}
