/** The clinic's policy file: the shipped defaults without one, every problem of a bad one named (project rules). */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEFAULT_POLICY } from '../../src/check/index.js';
import { loadPolicy } from '../../src/run/policy-file.js';

const dir = mkdtempSync(join(tmpdir(), 'plumbline-policy-'));

describe('the policy file', () => {
  it('is the shipped default when none is given, and reads back a written one', () => {
    expect(loadPolicy(undefined)).toEqual({ ok: true, value: DEFAULT_POLICY });
    const f = join(dir, 'p.json');
    writeFileSync(f, JSON.stringify({ ...DEFAULT_POLICY, description: 'ours' }));
    const r = loadPolicy(f);
    expect(r.ok && r.value.description).toBe('ours');
  });
  it('refuses an unreadable or invalid file, naming the file and the attribute', () => {
    const bad = join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ ...DEFAULT_POLICY, lowContributionShare: 2 }));
    const r = loadPolicy(bad);
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]).toMatchObject({ file: bad, path: 'lowContributionShare' });
    expect(loadPolicy(join(dir, 'missing.json')).ok).toBe(false);
  });
});
