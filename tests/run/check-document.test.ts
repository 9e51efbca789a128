/**
 * The result document is pure: the same plans, beam-data stamp, policy and time give the same
 * document; nothing in it comes from the clock or the disk (project rule for the document step).
 */
import { describe, expect, it } from 'vitest';
import { DEFAULT_POLICY } from '../../src/check/index.js';
import { CheckDocument } from '../../src/report/check-json.js';
import { checkDocument } from '../../src/run/check-document.js';

const stamp = { manifest: 'm.json', sha256: 'ab'.repeat(32), machine: 'M', dataVersion: '1', invented: true, validationWarnings: 0 };

describe('the check document', () => {
  it('is built from what it is given, time included, and its schema accepts it', () => {
    const a = checkDocument([], [], stamp, DEFAULT_POLICY, new Date(Date.UTC(2026, 11, 3)));
    const b = checkDocument([], [], stamp, DEFAULT_POLICY, new Date(Date.UTC(2026, 11, 3)));
    expect(a).toEqual(b);
    expect(a.createdAt).toBe('2026-12-03T00:00:00.000Z');
    expect(a.beamData).toEqual(stamp);
    expect(a.schemaVersion).toBe(5);
    expect(CheckDocument.safeParse(a).success).toBe(true);
  });
});
