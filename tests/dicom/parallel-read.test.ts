/** Reading byte ranges of many files into shared memory with a helper thread: every byte lands where asked, whoever reads it. */
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { readRanges, startReadHelper, stopReadHelper, type ReadRange } from '../../src/dicom/parallel-read.js';

const dir = mkdtempSync(join(tmpdir(), 'plumbline-parallel-read-'));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

const FILES = 40;
const SLICE = 64 * 1024;
const HEADER = 300;
/** Files of a header then a slice of bytes that differ per file and position. */
const files = Array.from({ length: FILES }, (_, i) => {
  const f = join(dir, `f${i}.bin`);
  const bytes = new Uint8Array(HEADER + SLICE);
  for (let j = 0; j < bytes.length; j++) bytes[j] = (i * 131 + j * 7) & 0xff;
  writeFileSync(f, bytes);
  return f;
});
const expected = (i: number, j: number) => (i * 131 + (HEADER + j) * 7) & 0xff;
// Slices land in reverse file order, to show the target offsets are honoured.
const ranges: ReadRange[] = files.map((file, i) => ({ file, position: HEADER, at: (FILES - 1 - i) * SLICE, length: SLICE }));

function check(target: Uint8Array) {
  for (let i = 0; i < FILES; i++) {
    const at = (FILES - 1 - i) * SLICE;
    for (let j = 0; j < SLICE; j += 997) if (target[at + j] !== expected(i, j)) throw new Error(`file ${i} byte ${j}`);
    expect(target[at + SLICE - 1]).toBe(expected(i, SLICE - 1));
  }
}

describe('reading ranges with a helper thread', () => {
  it('fills shared memory with every range, the helper reading some, calling back once per range on this thread', async () => {
    const helper = startReadHelper();
    expect(helper).toBeDefined();
    await new Promise((resolve) => helper!.worker.once('online', resolve));
    await new Promise((resolve) => setTimeout(resolve, 50)); // its message handler is in place
    const target = new Uint8Array(new SharedArrayBuffer(FILES * SLICE));
    const seen: number[] = [];
    let byHelper = 0;
    try {
      // A slow callback keeps this thread busy, so the helper surely takes ranges even on a loaded machine.
      byHelper = readRanges(target, ranges, helper, (k) => {
        seen.push(k);
        const until = performance.now() + 2;
        while (performance.now() < until);
      });
    } finally {
      stopReadHelper(helper);
    }
    check(target);
    expect(byHelper).toBeGreaterThan(0);
    expect([...seen].sort((a, b) => a - b)).toEqual(ranges.map((_, k) => k));
  });

  it('reads everything on this thread when the memory is not shared or no helper is given', () => {
    const target = new Uint8Array(FILES * SLICE);
    const helper = startReadHelper();
    expect(readRanges(target, ranges, helper)).toBe(0);
    stopReadHelper(helper);
    check(target);
    const alone = new Uint8Array(new SharedArrayBuffer(FILES * SLICE));
    readRanges(alone, ranges, undefined);
    check(alone);
  });

  it('throws naming the file when a file ends before its range, whichever thread took it', () => {
    const short = join(dir, 'short.bin');
    writeFileSync(short, new Uint8Array(HEADER + 10));
    const helper = startReadHelper();
    try {
      const bad = files.map((file, i) => ({ file: i % 2 ? short : file, position: HEADER, at: i * SLICE, length: SLICE }));
      expect(() => readRanges(new Uint8Array(new SharedArrayBuffer(FILES * SLICE)), bad, helper)).toThrow(
        expect.objectContaining({ code: 'truncated', file: short }),
      );
    } finally {
      stopReadHelper(helper);
    }
  });
});
