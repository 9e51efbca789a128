// The helper thread of parallel-read.ts: takes byte ranges from the shared counter and reads them
// into the shared target, marking each range's state. Plain JavaScript, so Node runs it as it is
// from src/ and from the bundle's folder, without a TypeScript loader.
import { closeSync, openSync, readSync } from 'node:fs';
import { parentPort } from 'node:worker_threads';

parentPort.on('message', ({ target, state, ranges, marks }) => {
  const bytes = new Uint8Array(target);
  const s = new Int32Array(state);
  for (;;) {
    const k = Atomics.add(s, 0, 1);
    if (k >= ranges.length) break;
    Atomics.store(s, 1 + k, marks.taken);
    const [file, position, at, length] = ranges[k];
    Atomics.store(s, 1 + k, readRange(bytes, file, position, at, length) ? marks.done : marks.failed);
    Atomics.notify(s, 1 + k);
  }
});

/** Reads `length` bytes of `file` from `position` to `at`; false when the file cannot give them (the main thread then reads it again to learn why). */
function readRange(bytes, file, position, at, length) {
  try {
    const fd = openSync(file, 'r');
    try {
      for (let done = 0; done < length; ) {
        const got = readSync(fd, bytes, at + done, length - done, position + done);
        if (got === 0) return false;
        done += got;
      }
      return true;
    } finally {
      closeSync(fd);
    }
  } catch {
    return false;
  }
}
