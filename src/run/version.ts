import { readFileSync } from 'node:fs';

/** The package version, read once from package.json (two levels above the built or source file). */
export const VERSION: string = (() => {
  // From src/cli (tsx), dist/src/cli (tsc) or dist/ (the bundle).
  for (const rel of ['../package.json', '../../package.json', '../../../package.json']) {
    try {
      const pkg = JSON.parse(readFileSync(new URL(rel, import.meta.url), 'utf8')) as { name?: string; version?: string };
      if (pkg.name === 'plumbline' && pkg.version) return pkg.version;
    } catch {
      /* try the next location */
    }
  }
  return '0.0.0';
})();
