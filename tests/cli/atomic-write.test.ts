import { mkdtempSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeFileAtomic } from '../../src/cli/atomic-write.js';

describe('writing a file atomically', () => {
  it('replaces the file whole and leaves no temporary file behind', () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-atomic-'));
    const file = join(dir, 'report.html');
    writeFileSync(file, 'old');
    writeFileAtomic(file, 'new report');
    expect(readFileSync(file, 'utf8')).toBe('new report');
    expect(readdirSync(dir)).toEqual(['report.html']);
  });
});
