/** `users add` and `users list`: accounts for the page, the password kept only as a hash that verifies; each refusal worded, nothing changed. */
import { mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { writeServiceConfig } from '../../scripts/lib/service-files.js';
import { runUsersAdd, runUsersList } from '../../src/cli/users.js';
import { SqliteHistoryStore } from '../../src/service/history/sqlite-store.js';
import { verifyPassword } from '../../src/service/web/passwords.js';

const root = mkdtempSync(join(tmpdir(), 'plumbline-users-'));
const config = writeServiceConfig(join(root, 'service.json'), { history: { kind: 'sqlite', file: join(root, 'history.sqlite') } });
const pw = (p: string | undefined) => async () => p;

describe('users', () => {
  it('adds a physicist, whose stored hash verifies the password and nothing else; lists the account without it', async () => {
    const o = await runUsersAdd({ config, name: 'Ann Physicist', role: 'physicist' }, pw('a long enough secret'));
    expect(o).toEqual({ stdout: ['account Ann Physicist (physicist) added'], stderr: [], exitCode: 0 });
    const store = new SqliteHistoryStore(join(root, 'history.sqlite'));
    const user = (await store.users()).find((u) => u.name === 'Ann Physicist')!;
    await store.close();
    expect(await verifyPassword('a long enough secret', user.passwordHash)).toBe(true);
    expect(await verifyPassword('a long enough secreT', user.passwordHash)).toBe(false);
    const list = await runUsersList({ config });
    expect(list.stdout.join('\n')).toMatch(/^Ann Physicist\tphysicist\tsince \d{4}-\d{2}-\d{2}$/m);
    expect(list.stdout.join('\n')).not.toContain('scrypt');
  });
  it('refuses a second account of the same name, a reset of an unknown one, a short password, two different passwords, no role', async () => {
    await runUsersAdd({ config, name: 'Bob', role: 'viewer' }, pw('another long secret'));
    expect((await runUsersAdd({ config, name: 'Bob', role: 'viewer' }, pw('another long secret'))).stderr[0]).toMatch(/exists already/);
    expect((await runUsersAdd({ config, name: 'Nobody', role: 'viewer', reset: true }, pw('a long enough secret'))).stderr[0]).toBe(
      'no account named Nobody',
    );
    expect((await runUsersAdd({ config, name: 'Cy', role: 'viewer' }, pw('short'))).stderr[0]).toMatch(/a password has at least \d+ characters/);
    expect((await runUsersAdd({ config, name: 'Cy', role: 'viewer' }, pw(undefined))).stderr[0]).toBe('the two passwords differ: nothing changed');
    expect((await runUsersAdd({ config, name: 'Cy' }, pw('a long enough secret'))).stderr[0]).toBe('--role must be physicist or viewer');
    expect((await runUsersList({ config })).stdout.some((l) => l.startsWith('Cy'))).toBe(false);
  });
  it('--reset sets a new password for an existing account', async () => {
    await runUsersAdd({ config, name: 'Dee', role: 'viewer' }, pw('first long secret'));
    expect((await runUsersAdd({ config, name: 'Dee', role: 'viewer', reset: true }, pw('second long secret'))).stdout).toEqual([
      'new password set for Dee',
    ]);
  });
});
