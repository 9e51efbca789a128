import { fileURLToPath } from 'node:url';
import { existsSync } from 'node:fs';

/** `demo` names the bundled invented machine; anything else is a manifest path. */
export function resolveBeamDataPath(arg: string): string {
  return arg === 'demo' ? resolveDemoFile('beam-data/manifest.json') : arg;
}

/** A file of the bundled demo scenario, found from src/cli (tsx), dist/src/cli (tsc) or dist/ (the bundle). */
export function resolveDemoFile(rel: string): string {
  for (const up of ['../', '../../', '../../../']) {
    const p = fileURLToPath(new URL(`${up}fixtures/demo/${rel}`, import.meta.url));
    if (existsSync(p)) return p;
  }
  return `fixtures/demo/${rel}`;
}

/** `demo` names the demo scenario's service configuration; anything else is a path. */
export function resolveServiceConfig(arg: string): string {
  return arg === 'demo' ? resolveDemoFile('service/plumbline-service.json') : arg;
}
