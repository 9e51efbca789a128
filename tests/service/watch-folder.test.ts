/** The watched export folder: a file is taken only once its size and time have stayed the same; then moved into the inbox under a new name. */
import { appendFileSync, mkdirSync, mkdtempSync, readdirSync, statSync, utimesSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { originalName, takeStableFiles, type WatchState } from '../../src/service/watch-folder.js';

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
    // Named anew (nothing of the exporter's file name decides where a file goes), yet still naming it for the record.
    expect(taken[0]).toMatch(/^[0-9a-f-]{36}--RP\.plan\.dcm$/);
    expect(originalName(taken[0]!)).toBe('RP.plan.dcm');
    // Its time is its arrival in the inbox, so the settle time counts from then.
    expect(Math.abs(statSync(join(inbox, taken[0]!)).mtimeMs - Date.now())).toBeLessThan(5000);
  });

  it('a file dated in the future is taken once it stops changing; a hidden file is said once, never taken', () => {
    const root = mkdtempSync(join(tmpdir(), 'plumbline-watch-'));
    const folder = join(root, 'export');
    const inbox = join(root, 'inbox');
    mkdirSync(folder, { recursive: true });
    const future = join(folder, 'future.dcm');
    writeFileSync(future, 'plan');
    const tomorrow = new Date(Date.now() + 86_400_000);
    utimesSync(future, tomorrow, tomorrow); // a clock elsewhere, a day ahead
    writeFileSync(join(folder, '.lock'), '');
    const lines: string[] = [];
    const state: WatchState = { seen: new Map(), told: new Set() };
    const t = Date.now();
    expect(takeStableFiles(folder, inbox, state, t, 10_000, (l) => lines.push(l))).toBe(0);
    expect(takeStableFiles(folder, inbox, state, t + 10_000, 10_000, (l) => lines.push(l))).toBe(1);
    expect(lines.filter((l) => /\.lock is hidden/.test(l))).toHaveLength(1);
    expect(readdirSync(folder)).toEqual(['.lock']);
  });
});
