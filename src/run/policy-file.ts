import { readFileSync } from 'node:fs';
import { DEFAULT_POLICY, Policy } from '../check/index.js';
import type { Result } from '../model/index.js';

/** The clinic's policy file, or the shipped defaults. */
export function loadPolicy(file: string | undefined): Result<Policy> {
  if (!file) return { ok: true, value: DEFAULT_POLICY };
  let json: unknown;
  try {
    json = JSON.parse(readFileSync(file, 'utf8'));
  } catch (e) {
    return {
      ok: false,
      issues: [{ severity: 'error', code: 'invalid-manifest', file, message: `cannot read the policy (${(e as Error).message})` }],
    };
  }
  const p = Policy.safeParse(json);
  if (!p.success)
    return {
      ok: false,
      issues: p.error.issues.map((i) => ({
        severity: 'error' as const,
        code: 'invalid-manifest' as const,
        file,
        path: i.path.join('.'),
        message: i.message,
      })),
    };
  return { ok: true, value: p.data };
}
