import { closeSync, fstatSync, openSync, readFileSync, readSync } from 'node:fs';
import type { Issue } from '../model/index.js';
import { parseDicomBytes } from './parse-bytes.js';

/** Most headers fit in this many bytes: read them alone first, the whole file only when not. */
const HEADER_BYTES = 64 * 1024;
const PIXEL_DATA = 'x7fe00010';

/**
 * A file's dataset up to its pixel data, from its first bytes when they hold it (the common case),
 * else from the whole file; with the file's size. An unreadable or broken file is an issue.
 */
export function parseHead(file: string): { ok: true; value: { parsed: Extract<ReturnType<typeof parseDicomBytes>, { ok: true }>['value']; size: number } } | { ok: false; issues: Issue[] } {
  let head: Buffer;
  let size: number;
  try {
    const fd = openSync(file, 'r');
    try {
      size = fstatSync(fd).size;
      head = Buffer.allocUnsafe(Math.min(size, HEADER_BYTES));
      readSync(fd, head, 0, head.length, 0);
    } finally {
      closeSync(fd);
    }
  } catch (e) {
    return { ok: false, issues: [{ severity: 'error', code: 'unreadable', file, message: `cannot read the file (${(e as NodeJS.ErrnoException).code ?? String(e)})` }] };
  }
  let parsed = parseDicomBytes(head, file, { untilTag: PIXEL_DATA });
  if ((!parsed.ok || !parsed.value.dataSet.elements[PIXEL_DATA]) && size > head.length) parsed = parseDicomBytes(readFileSync(file), file, { untilTag: PIXEL_DATA });
  if (!parsed.ok) return { ok: false, issues: [...parsed.issues] };
  return { ok: true, value: { parsed: parsed.value, size } };
}
