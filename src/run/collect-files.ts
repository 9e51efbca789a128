import { lstatSync, readdirSync, realpathSync, type Stats, statSync } from 'node:fs';
import { join } from 'node:path';

export interface CollectedFile {
  readonly path: string;
  /** Named on the command line (its problems are errors) or found in a folder (other objects are skipped). */
  readonly explicit: boolean;
  /**
   * Why the path must not be read: a link that leads nowhere or in a circle (refused), or no
   * regular file (a FIFO, a socket, a device: skipped, since reading one may never end).
   */
  readonly problem?: { readonly kind: 'refuse' | 'skip'; readonly reason: string };
}

/**
 * Expands folders (recursively, in name order, each real folder once) into their files; files are
 * kept as given. Nothing is opened here: every path comes back, with its problem when it has one.
 */
export function collectFiles(args: readonly string[]): CollectedFile[] {
  const out: CollectedFile[] = [];
  const seen = new Set<string>();
  const visit = (path: string, explicit: boolean) => {
    const st = stat(path);
    if ('problem' in st) {
      // A missing file named on the command line is the reader's to report ("no such file").
      if (!(explicit && st.missing)) out.push({ path, explicit, problem: { kind: 'refuse', reason: st.problem } });
      else out.push({ path, explicit });
      return;
    }
    if (st.isDirectory()) return walk(path);
    if (st.isFile()) return out.push({ path, explicit });
    out.push({ path, explicit, problem: { kind: 'skip', reason: `not a regular file (${specialKind(st)}), never opened` } });
  };
  const walk = (dir: string) => {
    const real = realpathSync(dir);
    if (seen.has(real)) return;
    seen.add(real);
    let names: string[];
    try {
      names = readdirSync(dir).sort();
    } catch (e) {
      out.push({ path: dir, explicit: false, problem: { kind: 'refuse', reason: `the folder cannot be listed (${errorCode(e)})` } });
      return;
    }
    for (const name of names) if (!name.startsWith('.')) visit(join(dir, name), false);
  };
  for (const a of args) visit(a, true);
  return out;
}

/** The path's status through links, or why there is none. */
function stat(path: string): Stats | { problem: string; missing?: true } {
  try {
    return statSync(path);
  } catch (e) {
    const code = errorCode(e);
    if (code === 'ELOOP') return { problem: 'a symbolic link that leads back to itself (a loop)' };
    if (code === 'ENOENT') {
      const link = lstatOrUndefined(path)?.isSymbolicLink();
      return link ? { problem: 'a symbolic link to nothing (its target does not exist)' } : { problem: 'no such file', missing: true };
    }
    return { problem: `cannot be read (${code})` };
  }
}

function lstatOrUndefined(path: string): Stats | undefined {
  try {
    return lstatSync(path);
  } catch {
    return undefined;
  }
}

function specialKind(st: Stats): string {
  if (st.isFIFO()) return 'a FIFO';
  if (st.isSocket()) return 'a socket';
  if (st.isCharacterDevice() || st.isBlockDevice()) return 'a device';
  return 'a special file';
}

const errorCode = (e: unknown): string => (e as NodeJS.ErrnoException).code ?? String(e);
