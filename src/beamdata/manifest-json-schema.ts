import { z } from 'zod';
import { Manifest } from './manifest-schema.js';

/** The manifest's JSON Schema text, as committed in manifest.schema.json. */
export function manifestJsonSchemaText(): string {
  const schema = z.toJSONSchema(Manifest, { io: 'input', unrepresentable: 'any' });
  return `${JSON.stringify({ title: 'plumbline beam-data manifest', ...schema }, null, 2)}\n`;
}
