import { DEFAULT_POLICY, Policy } from '../check/index.js';
import type { Result } from '../model/index.js';
import { readJsonFile } from './json-file.js';

/** The clinic's policy file, or the shipped defaults. */
export function loadPolicy(file: string | undefined): Result<Policy> {
  if (!file) return { ok: true, value: DEFAULT_POLICY };
  return readJsonFile(file, Policy, 'policy', 'invalid-manifest');
}
