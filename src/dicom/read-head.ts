import { closeSync, fstatSync, openSync, readFileSync, readSync } from 'node:fs';
import type { Result } from '../model/index.js';
import { parseDicomBytes } from './parse-bytes.js';

/** Most headers fit in the first size, nearly all in the second: read those first, the whole file only when not. */
const FIRST_HEADER_BYTES = 8 * 1024;
const HEADER_BYTES = 64 * 1024;
const PIXEL_DATA = 'x7fe00010';

/** A buffer for `parseHead` to read headers into, reused across files (see there). */
export function headScratch(): Buffer {
  return Buffer.allocUnsafe(HEADER_BYTES);
}

/**
 * A file's dataset up to its pixel data, from its first bytes when they hold it (the common case),
 * else from the whole file; with the file's size. An unreadable or broken file is an issue.
 * With `scratch` (from `headScratch`) the first bytes are read into it: the dataset is then valid
 * only until the next call with the same scratch. Why: a fresh 64 KiB buffer per slice of a
 * 200-slice CT cost more in allocation and garbage collection than parsing the headers.
 */
export function parseHead(
  file: string,
  scratch?: Buffer,
): Result<{ parsed: Extract<ReturnType<typeof parseDicomBytes>, { ok: true }>['value']; size: number }> {
  let size: number;
  let parsed: ReturnType<typeof parseDicomBytes> | undefined;
  try {
    const fd = openSync(file, 'r');
    try {
      size = fstatSync(fd).size;
      for (const step of [FIRST_HEADER_BYTES, HEADER_BYTES]) {
        const n = Math.min(size, step);
        const head = scratch && scratch.length >= n ? scratch.subarray(0, n) : Buffer.allocUnsafe(n);
        readSync(fd, head, 0, n, 0);
        parsed = parseDicomBytes(head, file, { untilTag: PIXEL_DATA });
        if ((parsed.ok && parsed.value.dataSet.elements[PIXEL_DATA]) || n === size) break;
      }
    } finally {
      closeSync(fd);
    }
  } catch (e) {
    return {
      ok: false,
      issues: [{ severity: 'error', code: 'unreadable', file, message: `cannot read the file (${(e as NodeJS.ErrnoException).code ?? String(e)})` }],
    };
  }
  if (!parsed || ((!parsed.ok || !parsed.value.dataSet.elements[PIXEL_DATA]) && size > HEADER_BYTES))
    parsed = parseDicomBytes(readFileSync(file), file, { untilTag: PIXEL_DATA });
  if (!parsed.ok) return { ok: false, issues: [...parsed.issues] };
  return { ok: true, value: { parsed: parsed.value, size } };
}
