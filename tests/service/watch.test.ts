/** The watched export folder: a file is taken only once its size and time have stayed the same; then moved into the inbox under a new name. */
import { appendFileSync, mkdirSync, mkdtempSync, readdirSync, statSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { takeStableFiles, type WatchState } from '../../src/service/watch-folder.js';

describe('the watched folder', () => {
  it('leaves a file while it is still being written, takes it once stable, subfolders included', () => {
    const root = mkdtempSync(join(tmpdir(), 'plumbline-watch-'));
    const folder = join(root, 'export');
    const inbox = join(root, 'inbox');
    mkdirSync(join(folder, 'patient 1'), { recursive: true });
    const file = join(folder, 'patient 1', 'RP.plan.dcm');
    writeFileSync(file, 'first half');
    const state: WatchState = { seen: new Map() };
    const t = Date.now() + 60_000; // well past the file's modification time
    expect(takeStableFiles(folder, inbox, state, t, 2000)).toBe(0); // first sight
    appendFileSync(file, ', second half');
    expect(takeStableFiles(folder, inbox, state, t + 2500, 2000)).toBe(0); // it grew: start again
    expect(takeStableFiles(folder, inbox, state, t + 3000, 2000)).toBe(0); // unchanged, but not for 2 s yet
    expect(takeStableFiles(folder, inbox, state, t + 5000, 2000)).toBe(1);
    expect(readdirSync(join(folder, 'patient 1'))).toEqual([]);
    const taken = readdirSync(inbox).filter((f) => !f.startsWith('.'));
    expect(taken).toHaveLength(1);
    // Named anew: nothing of the exporter's file name decides where a file goes.
    expect(taken[0]).toMatch(/^[0-9a-f-]{36}\.dcm$/);
    // Its time is its arrival in the inbox, so the settle time counts from then.
    expect(Math.abs(statSync(join(inbox, taken[0]!)).mtimeMs - Date.now())).toBeLessThan(5000);
  });
});
