/**
 * Writes the JSON Schema of the beam-data manifest (for editors: `"$schema"` in a manifest) from
 * its zod schema, the single source. Run `npm run schemas`; a test fails when it is out of date.
 */
import { renameSync, writeFileSync } from 'node:fs';
import { manifestJsonSchemaText } from '../src/beamdata/manifest-json-schema.js';

const target = new URL('../src/beamdata/manifest.schema.json', import.meta.url);
const tmp = new URL('../src/beamdata/manifest.schema.json.tmp', import.meta.url);
writeFileSync(tmp, manifestJsonSchemaText());
renameSync(tmp, target);
console.log('wrote src/beamdata/manifest.schema.json');
