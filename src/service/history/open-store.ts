import { readFileSync } from 'node:fs';
import type { Result } from '../../model/index.js';
import type { HistoryConfig } from '../config.js';
import { PostgresHistoryStore } from './postgres-store.js';
import { SqliteHistoryStore } from './sqlite-store.js';
import type { HistoryStore } from './store.js';

/** The history the configuration names, its schema brought up to date; a database that cannot be reached is an error a user can act on. */
export async function openHistoryStore(h: HistoryConfig): Promise<Result<HistoryStore>> {
  if (h.kind === 'sqlite') {
    try {
      return { ok: true, value: new SqliteHistoryStore(h.file) };
    } catch (e) {
      return refused(`the history file ${h.file} cannot be opened: ${(e as Error).message}`);
    }
  }
  const password = passwordOf(h);
  if (!password.ok) return password;
  try {
    const value = await PostgresHistoryStore.open(
      { connectionString: h.url, ...(password.value !== undefined ? { password: password.value } : {}) },
      h.url,
    );
    return { ok: true, value };
  } catch (e) {
    return refused(`the history database ${h.url} cannot be used: ${(e as Error).message}`);
  }
}

/** The password from its environment variable or file; none when neither is given (a Unix socket with peer or trust authentication). */
function passwordOf(h: Extract<HistoryConfig, { kind: 'postgres' }>): Result<string | undefined> {
  if (h.passwordEnv) {
    const v = process.env[h.passwordEnv];
    return v ? { ok: true, value: v } : refused(`the environment variable ${h.passwordEnv} (history.passwordEnv) is not set`);
  }
  if (h.passwordFile) {
    try {
      return { ok: true, value: readFileSync(h.passwordFile, 'utf8').split(/\r?\n/)[0]! };
    } catch (e) {
      return refused(`the password file ${h.passwordFile} (history.passwordFile) cannot be read: ${(e as NodeJS.ErrnoException).code ?? e}`);
    }
  }
  return { ok: true, value: undefined };
}

function refused(message: string): { ok: false; issues: [{ severity: 'error'; code: 'invalid-option'; path: string; message: string }] } {
  return { ok: false, issues: [{ severity: 'error', code: 'invalid-option', path: 'history', message }] };
}
