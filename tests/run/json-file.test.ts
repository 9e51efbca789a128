import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { readJsonFile } from '../../src/run/json-file.js';

const dir = mkdtempSync(join(tmpdir(), 'plumbline-json-'));
const schema = z.object({ port: z.number().int() });

describe('a JSON file read against its schema', () => {
  it('gives the value, or an issue per problem naming the file and the attribute', () => {
    writeFileSync(join(dir, 'good.json'), '{"port": 11112}');
    expect(readJsonFile(join(dir, 'good.json'), schema, 'configuration', 'invalid-option')).toEqual({ ok: true, value: { port: 11112 } });
    writeFileSync(join(dir, 'bad.json'), '{"port": "x"}');
    const bad = readJsonFile(join(dir, 'bad.json'), schema, 'configuration', 'invalid-option');
    expect(bad.ok ? [] : bad.issues).toEqual([expect.objectContaining({ file: join(dir, 'bad.json'), path: 'port', code: 'invalid-option' })]);
  });
  it('says when the file is no JSON or is missing', () => {
    writeFileSync(join(dir, 'broken.json'), '{');
    const broken = readJsonFile(join(dir, 'broken.json'), schema, 'configuration', 'invalid-option');
    expect(broken.ok ? '' : broken.issues[0]!.message).toMatch(/^cannot read the configuration \(/);
    const missing = readJsonFile(join(dir, 'none.json'), schema, 'configuration', 'invalid-option');
    expect(missing.ok ? '' : missing.issues[0]!.message).toMatch(/ENOENT/);
  });
});
