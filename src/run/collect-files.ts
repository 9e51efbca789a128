import { readdirSync, statSync } from 'node:fs';
import { join } from 'node:path';

export interface CollectedFile {
  readonly path: string;
  /** Named on the command line (its problems are errors) or found in a folder (other objects are skipped). */
  readonly explicit: boolean;
}

/** Expands folders (recursively, in name order) into their files; files are kept as given. */
export function collectFiles(args: readonly string[]): CollectedFile[] {
  const out: CollectedFile[] = [];
  const walk = (dir: string) => {
    for (const name of readdirSync(dir).sort()) {
      if (name.startsWith('.')) continue;
      const p = join(dir, name);
      if (statSync(p).isDirectory()) walk(p);
      else out.push({ path: p, explicit: false });
    }
  };
  for (const a of args) {
    let isDir = false;
    try {
      isDir = statSync(a).isDirectory();
    } catch {
      /* a missing path is reported by the reader */
    }
    if (isDir) walk(a);
    else out.push({ path: a, explicit: true });
  }
  return out;
}
