import { readFileSync } from 'node:fs';
import type { z } from 'zod';
import type { Issue, Result } from '../model/index.js';

/** A JSON file validated by its schema: the value, or an issue per problem naming the file and the attribute. */
export function readJsonFile<T>(file: string, schema: z.ZodType<T>, what: string, code: Issue['code']): Result<T> {
  let json: unknown;
  try {
    json = JSON.parse(readFileSync(file, 'utf8'));
  } catch (e) {
    return { ok: false, issues: [{ severity: 'error', code, file, message: `cannot read the ${what} (${(e as Error).message})` }] };
  }
  const p = schema.safeParse(json);
  if (!p.success)
    return { ok: false, issues: p.error.issues.map((i) => ({ severity: 'error', code, file, path: i.path.join('.'), message: i.message })) };
  return { ok: true, value: p.data };
}
