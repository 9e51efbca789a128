import { z } from 'zod';
import { formatIssue } from '../model/index.js';
import { loadServiceConfig } from '../service/config.js';
import { openHistoryStore } from '../service/history/open-store.js';
import { Role, UserRecord } from '../service/history/store.js';
import { hashPassword, MIN_PASSWORD_LENGTH } from '../service/web/passwords.js';
import type { CommandOutcome } from './outcome.js';

export const UsersAddOptions = z.object({
  config: z.string().min(1),
  name: UserRecord.shape.name,
  role: Role.or(z.undefined()).refine((r) => r !== undefined, '--role must be physicist or viewer'),
  /** Replace the password of an existing account instead. */
  reset: z.boolean().default(false),
});

/**
 * `plumbline users add NAME --role physicist|viewer`: an account for the page, its password read
 * from standard input and kept only as an scrypt hash; `--reset` sets a new password for an
 * existing account.
 */
export async function runUsersAdd(raw: Record<string, unknown>, password: () => Promise<string | undefined>): Promise<CommandOutcome> {
  const p = UsersAddOptions.safeParse(raw);
  if (!p.success)
    return refuse(p.error.issues.map((i) => (i.path[0] === 'role' ? '--role must be physicist or viewer' : `${i.path.join('.')}: ${i.message}`)));
  const config = loadServiceConfig(p.data.config);
  if (!config.ok) return refuse(config.issues.map(formatIssue));
  const pw = await password();
  if (pw === undefined) return refuse(['the two passwords differ: nothing changed']);
  if ([...pw].length < MIN_PASSWORD_LENGTH) return refuse([`a password has at least ${MIN_PASSWORD_LENGTH} characters: nothing changed`]);
  const opened = await openHistoryStore(config.value.history);
  if (!opened.ok) return refuse(opened.issues.map(formatIssue));
  const store = opened.value;
  try {
    const hash = await hashPassword(pw);
    const { name, role } = p.data;
    if (p.data.reset) {
      return (await store.setPassword(name, hash))
        ? { stdout: [`new password set for ${name}`], stderr: [], exitCode: 0 }
        : refuse([`no account named ${name}`]);
    }
    const added = await store.addUser({ name, role: role!, passwordHash: hash, createdAt: new Date().toISOString() });
    return added
      ? { stdout: [`account ${name} (${role}) added`], stderr: [], exitCode: 0 }
      : refuse([`an account named ${name} exists already (--reset sets a new password)`]);
  } finally {
    await store.close();
  }
}

/** `plumbline users list`: the accounts and their roles (never their password hashes). */
export async function runUsersList(raw: Record<string, unknown>): Promise<CommandOutcome> {
  const p = z.object({ config: z.string().min(1) }).safeParse(raw);
  if (!p.success) return refuse(['--config is required']);
  const config = loadServiceConfig(p.data.config);
  if (!config.ok) return refuse(config.issues.map(formatIssue));
  const opened = await openHistoryStore(config.value.history);
  if (!opened.ok) return refuse(opened.issues.map(formatIssue));
  try {
    const users = await opened.value.users();
    return {
      stdout: users.length ? users.map((u) => `${u.name}\t${u.role}\tsince ${u.createdAt.slice(0, 10)}`) : ['no accounts'],
      stderr: [],
      exitCode: 0,
    };
  } finally {
    await opened.value.close();
  }
}

function refuse(lines: readonly string[]): CommandOutcome {
  return { stdout: [], stderr: [...lines], exitCode: 2 };
}
