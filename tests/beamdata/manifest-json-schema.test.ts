/** The JSON Schema of the manifest, for editors and other tools: generated from the zod schema, committed, and kept equal. */
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { manifestJsonSchemaText } from '../../src/beamdata/manifest-json-schema.js';

describe('manifestJsonSchemaText', () => {
  it('the committed JSON Schema is the one the zod schema generates (run npm run schemas)', () => {
    expect(readFileSync(new URL('../../src/beamdata/manifest.schema.json', import.meta.url), 'utf8')).toBe(manifestJsonSchemaText());
  });
  it('is a JSON Schema (2020-12) that requires the format, its version, the data version and the machine', () => {
    const schema = JSON.parse(manifestJsonSchemaText());
    expect(schema.$schema).toMatch(/json-schema\.org/);
    expect(schema.required).toEqual(['format', 'formatVersion', 'dataVersion', 'machine']);
  });
});
