/** Every path of a folder comes back, with its problem when it has one; nothing is opened (project rules). */
import { execFileSync } from 'node:child_process';
import { mkdirSync, mkdtempSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { collectFiles } from '../../src/run/collect-files.js';

describe('collecting the files of a folder', () => {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-collect-'));
  writeFileSync(join(dir, 'a.dcm'), 'x');
  mkdirSync(join(dir, 'sub'));
  writeFileSync(join(dir, 'sub', 'b.dcm'), 'x');
  symlinkSync(join(dir, 'nothing'), join(dir, 'dangling.dcm'));
  symlinkSync('loop-b', join(dir, 'loop-a'));
  symlinkSync('loop-a', join(dir, 'loop-b'));
  symlinkSync(dir, join(dir, 'sub', 'back-to-top'));
  execFileSync('mkfifo', [join(dir, 'pipe.dcm')]); // coreutils
  writeFileSync(join(dir, '.hidden'), 'x');
  const got = collectFiles([dir]);
  const byName = (name: string) => got.find((f) => f.path.endsWith(name));

  it('finds the files of the folder and its subfolders, each real folder once (a link back up is not followed twice)', () => {
    expect(got.filter((f) => !f.problem).map((f) => f.path)).toEqual([join(dir, 'a.dcm'), join(dir, 'sub', 'b.dcm')]);
  });
  it('refuses a link to nothing and a link loop, with the reason', () => {
    expect(byName('dangling.dcm')?.problem).toEqual({ kind: 'refuse', reason: expect.stringMatching(/link to nothing/) });
    expect(byName('loop-a')?.problem).toEqual({ kind: 'refuse', reason: expect.stringMatching(/loop/) });
  });
  it('skips a FIFO without opening it (reading one may never end)', () => {
    expect(byName('pipe.dcm')?.problem).toEqual({ kind: 'skip', reason: 'not a regular file (a FIFO), never opened' });
  });
  it('a missing file named on the command line is left to the reader to report', () => {
    expect(collectFiles([join(dir, 'absent.dcm')])).toEqual([{ path: join(dir, 'absent.dcm'), explicit: true }]);
  });
});
