import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { HistoryConfig } from '../../../src/service/config.js';
import { openHistoryStore } from '../../../src/service/history/open-store.js';

describe('the history the configuration names', () => {
  it('takes the SQLite file in the old form and the new one alike', () => {
    expect(HistoryConfig.parse({ database: 'h.sqlite' })).toEqual({ kind: 'sqlite', file: 'h.sqlite' });
    expect(HistoryConfig.parse({ kind: 'sqlite', file: 'h.sqlite' })).toEqual({ kind: 'sqlite', file: 'h.sqlite' });
  });
  it('refuses a PostgreSQL URL holding a password', () => {
    const r = HistoryConfig.safeParse({ kind: 'postgres', url: 'postgresql://plumbline:secret@db/plumbline' });
    expect(r.success).toBe(false);
    expect(JSON.stringify(r.error?.issues)).toMatch(/no password in the URL: give passwordEnv or passwordFile/);
  });
  it('says what to do when the password cannot be had, before connecting', async () => {
    delete process.env.PLUMBLINE_TEST_NO_SUCH_VARIABLE;
    const env = await openHistoryStore({
      kind: 'postgres',
      url: 'postgresql://plumbline@db/plumbline',
      passwordEnv: 'PLUMBLINE_TEST_NO_SUCH_VARIABLE',
    });
    expect(env.ok ? '' : env.issues[0]!.message).toMatch(/PLUMBLINE_TEST_NO_SUCH_VARIABLE \(history\.passwordEnv\) is not set/);
    const file = await openHistoryStore({ kind: 'postgres', url: 'postgresql://plumbline@db/plumbline', passwordFile: '/nonexistent/pw' });
    expect(file.ok ? '' : file.issues[0]!.message).toMatch(/password file .* cannot be read: ENOENT/);
  });
  it('names the database it cannot reach, without credentials', async () => {
    const dir = mkdtempSync(join(tmpdir(), 'plumbline-open-'));
    writeFileSync(join(dir, 'pw'), 'secret\n');
    const r = await openHistoryStore({
      kind: 'postgres',
      url: `postgresql://plumbline@/x?host=${encodeURIComponent(dir)}&port=1`,
      passwordFile: join(dir, 'pw'),
    });
    expect(r.ok).toBe(false);
    const message = r.ok ? '' : r.issues[0]!.message;
    expect(message).toMatch(/the history database postgresql:\/\/plumbline@\/x.* cannot be used/);
    expect(message).not.toContain('secret');
  });
});
