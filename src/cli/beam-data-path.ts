import { fileURLToPath } from 'node:url';
import { existsSync } from 'node:fs';

/** `demo` names the bundled invented machine; anything else is a manifest path. */
export function resolveBeamDataPath(arg: string): string {
  if (arg !== 'demo') return arg;
  for (const rel of ['../fixtures/demo/beam-data/manifest.json', '../../fixtures/demo/beam-data/manifest.json', '../../../fixtures/demo/beam-data/manifest.json']) {
    const p = fileURLToPath(new URL(rel, import.meta.url));
    if (existsSync(p)) return p;
  }
  return 'fixtures/demo/beam-data/manifest.json';
}
