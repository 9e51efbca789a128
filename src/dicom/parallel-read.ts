/**
 * Reading many byte ranges of many files into one shared memory with a second thread. Why: filling
 * a fresh 100 MiB CT volume is bound by the kernel's page faults, not by the copy, and two threads
 * fault in parallel. The helper thread is started before the headers are parsed so its start-up
 * overlaps that work; it and this thread take ranges from one shared counter, so if it is slow to
 * start (or never starts) this thread simply reads everything itself. The helper is read-helper.mjs.
 */
import { closeSync, existsSync, openSync, readSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Worker } from 'node:worker_threads';

/** One range: `length` bytes of `file` from byte `position`, to byte `at` of the target. */
export interface ReadRange {
  readonly file: string;
  readonly position: number;
  readonly at: number;
  readonly length: number;
}

/** Per range: 0 not taken (or just taken), 1 being read, 2 done, 3 failed (this thread reads it again to learn why). */
const TAKEN = 1;
const DONE = 2;
const FAILED = 3;
/**
 * How long to wait for a range the helper is reading. Past it the read fails rather than be taken
 * over here: a helper that wakes up later would write stored values over rescaled ones.
 */
const HELPER_WAIT_MS = 60_000;

/** The helper's module (plain JavaScript): beside this file under src/, beside the bundle once built. */
function helperUrl(): URL | undefined {
  for (const rel of ['./read-helper.mjs', '../read-helper.mjs']) {
    const u = new URL(rel, import.meta.url);
    if (existsSync(fileURLToPath(u))) return u;
  }
  return undefined;
}

/** A helper thread waiting for ranges to read. */
export interface ReadHelper {
  readonly worker: Worker;
}

/** A helper thread, or `undefined` where threads are unavailable; end it with `stopReadHelper`. */
export function startReadHelper(): ReadHelper | undefined {
  try {
    const url = helperUrl();
    if (!url) return undefined; // this thread reads everything itself
    const worker = new Worker(url);
    worker.unref();
    worker.on('error', () => undefined); // a helper that fails leaves its ranges to this thread
    return { worker };
  } catch {
    return undefined;
  }
}

/**
 * Reads every range into `target`, sharing the work with the helper when `target` views a
 * SharedArrayBuffer; `then(k)` runs on this thread once range k is in (while its bytes are still in
 * the cache, for this thread's own ranges). Returns how many ranges the helper read. Throws like
 * `readSync` for a range that cannot be read, with the range's `file` on the error (`code`
 * 'truncated' for a file that ends early).
 */
export function readRanges(
  target: Uint8Array,
  ranges: readonly ReadRange[],
  helper: ReadHelper | undefined,
  then: (k: number) => void = () => undefined,
): number {
  if (!helper || !(target.buffer instanceof SharedArrayBuffer)) {
    ranges.forEach((r, k) => {
      readRange(target, r);
      then(k);
    });
    return 0;
  }
  const state = new Int32Array(new SharedArrayBuffer(4 * (1 + ranges.length)));
  helper.worker.postMessage({
    target: target.buffer,
    state: state.buffer,
    ranges: ranges.map((r) => [r.file, r.position, target.byteOffset + r.at, r.length]),
    marks: { taken: TAKEN, done: DONE, failed: FAILED },
  });
  const mine: number[] = [];
  for (;;) {
    const k = Atomics.add(state, 0, 1);
    if (k >= ranges.length) break;
    readRange(target, ranges[k]!);
    then(k);
    mine.push(k);
  }
  const taken = new Set(mine);
  let byHelper = 0;
  for (let k = 0; k < ranges.length; k++) {
    if (taken.has(k)) continue;
    const deadline = performance.now() + HELPER_WAIT_MS;
    let v: number;
    while ((v = Atomics.load(state, 1 + k)) < DONE && performance.now() < deadline) Atomics.wait(state, 1 + k, v, deadline - performance.now());
    if (v === DONE) byHelper++;
    else if (v === FAILED)
      readRange(target, ranges[k]!); // to throw its error here (or read it after all)
    else
      throw Object.assign(new Error(`the helper thread did not finish reading within ${HELPER_WAIT_MS / 1000} s`), {
        code: 'ETIMEDOUT',
        file: ranges[k]!.file,
      });
    then(k);
  }
  return byHelper;
}

export function stopReadHelper(helper: ReadHelper | undefined): void {
  if (helper) void helper.worker.terminate();
}

function readRange(target: Uint8Array, r: ReadRange): void {
  try {
    const fd = openSync(r.file, 'r');
    try {
      for (let done = 0; done < r.length; ) {
        const got = readSync(fd, target, r.at + done, r.length - done, r.position + done);
        if (got === 0) throw Object.assign(new Error('the file ended early'), { code: 'truncated' });
        done += got;
      }
    } finally {
      closeSync(fd);
    }
  } catch (e) {
    throw Object.assign(e as Error, { file: r.file });
  }
}
