import { existsSync } from 'node:fs';
import { delimiter, join } from 'node:path';

/** Debian's Chromium on PATH (playwright-core downloads no browser). */
export function chromiumPath(): string {
  for (const dir of (process.env.PATH ?? '').split(delimiter)) {
    const p = join(dir, 'chromium');
    if (existsSync(p)) return p;
  }
  throw new Error('chromium is not installed (sudo apt-get install chromium; .ci/run does this)');
}
