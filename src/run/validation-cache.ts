import { createHash } from 'node:crypto';
import { mkdirSync, readFileSync, renameSync, writeFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { join } from 'node:path';
import { z } from 'zod';
import { type Issue, IssueJson } from '../model/index.js';
import { VERSION } from './version.js';

/**
 * Beam data that passed their validation are remembered by the SHA-256 of every byte of the manifest
 * and its tables, the manifest's path and the plumbline version: the same data need not be validated
 * again, and a change of any byte (or of plumbline) validates afresh. Only a pass is remembered, with
 * its warnings; the cache is an optimisation, so a cache that cannot be read or written is ignored.
 */
const Entry = z.object({ tool: z.string(), key: z.string(), warnings: z.array(IssueJson) });

/** `PLUMBLINE_CACHE_DIR`, else `$XDG_CACHE_HOME/plumbline`, else `~/.cache/plumbline`; "off" turns the cache off. */
export function validationCacheDir(env: NodeJS.ProcessEnv = process.env): string | undefined {
  const set = env.PLUMBLINE_CACHE_DIR;
  if (set === 'off') return undefined;
  const base = set || (env.XDG_CACHE_HOME ? join(env.XDG_CACHE_HOME, 'plumbline') : join(homedir(), '.cache', 'plumbline'));
  return join(base, 'validated-beam-data');
}

/** The cache key of one set of beam data. */
export function validationKey(manifestFile: string, dataSha256: string): string {
  return createHash('sha256').update(`${VERSION}\0${manifestFile}\0${dataSha256}`).digest('hex');
}

/** The warnings of an earlier pass of exactly these beam data, if remembered. */
export function rememberedPass(dir: string | undefined, key: string): Issue[] | undefined {
  if (!dir) return undefined;
  try {
    const e = Entry.safeParse(JSON.parse(readFileSync(join(dir, `${key}.json`), 'utf8')));
    if (!e.success || e.data.key !== key || e.data.tool !== VERSION) return undefined;
    return e.data.warnings as Issue[];
  } catch {
    return undefined;
  }
}

/** Remembers a pass (written whole or not at all). */
export function rememberPass(dir: string | undefined, key: string, warnings: readonly Issue[]): void {
  if (!dir) return;
  try {
    mkdirSync(dir, { recursive: true });
    const file = join(dir, `${key}.json`);
    writeFileSync(`${file}.${process.pid}.tmp`, JSON.stringify({ tool: VERSION, key, warnings }));
    renameSync(`${file}.${process.pid}.tmp`, file);
  } catch {
    // Not remembered: the next run validates again.
  }
}
