import { readdirSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { join } from 'node:path';

export const DEMO_DIR = fileURLToPath(new URL('../../fixtures/demo/plans/', import.meta.url));
export const DEMO_BEAM_DATA_DIR = fileURLToPath(new URL('../../fixtures/demo/beam-data/', import.meta.url));

/** The demo RT Plans written by scripts/make-fixtures.ts. */
export const DEMO_PLANS: readonly string[] = readdirSync(DEMO_DIR)
  .filter((f) => f.endsWith('.dcm'))
  .sort()
  .map((f) => join(DEMO_DIR, f));

export const demoPlan = (name: string) => join(DEMO_DIR, name);
