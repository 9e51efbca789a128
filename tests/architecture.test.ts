/**
 * The one direction of flow (DICOM → model → geometry → physics → check → report), enforced on the
 * import statements of src/: each folder may import only what the architecture allows.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const SRC = fileURLToPath(new URL('../src/', import.meta.url));

const ALLOWED: Readonly<Record<string, readonly string[]>> = {
  model: ['model', 'zod'],
  dicom: ['model', 'dicom', 'dicom-parser', 'node:zlib', 'node:fs', 'node:worker_threads'], // a second thread reads CT pixels
  geometry: ['model', 'geometry'],
  beamdata: ['model', 'beamdata', 'zod', 'node:fs', 'node:path'],
  physics: ['model', 'physics'],
  check: ['model', 'geometry', 'physics', 'beamdata', 'check', 'zod'],
  report: ['model', 'report', 'zod'],
  types: [],
};

function files(dir: string): string[] {
  return readdirSync(dir).flatMap((n) => {
    const p = join(dir, n);
    return statSync(p).isDirectory() ? files(p) : p.endsWith('.ts') ? [p] : [];
  });
}

const IMPORT = /^\s*(?:import|export)\s[^'"]*?from\s+['"]([^'"]+)['"]|^\s*import\s+['"]([^'"]+)['"]/gm;

function importsOf(file: string): { folder: string; target: string }[] {
  const rel = relative(SRC, file).split(sep);
  const text = readFileSync(file, 'utf8');
  const out: { folder: string; target: string }[] = [];
  for (const m of text.matchAll(IMPORT)) {
    const spec = (m[1] ?? m[2])!;
    if (spec.startsWith('.')) {
      const target = relative(SRC, join(file, '..', spec)).split(sep);
      out.push({ folder: rel.length > 1 ? rel[0]! : '', target: target.length > 1 ? target[0]! : target[0]!.replace(/\.js$/, '') });
    } else {
      out.push({ folder: rel.length > 1 ? rel[0]! : '', target: spec });
    }
  }
  return out;
}

describe('import directions in src/', () => {
  const all = files(SRC);
  it('every folder imports only what the architecture allows', () => {
    const violations = all.flatMap((f) =>
      importsOf(f)
        .filter(({ folder, target }) => ALLOWED[folder] !== undefined && !ALLOWED[folder]!.includes(target) && !(target === 'errors' && folder !== 'model'))
        .map(({ target }) => `${relative(SRC, f)} imports ${target}`),
    );
    expect(violations).toEqual([]);
  });

  it('no DICOM tag literal appears outside src/dicom', () => {
    const offenders = all.filter((f) => !relative(SRC, f).startsWith(`dicom${sep}`) && /['"`]x[0-9a-f]{8}['"`]/.test(readFileSync(f, 'utf8')));
    expect(offenders.map((f) => relative(SRC, f))).toEqual([]);
  });

  it('the checker itself notices a forbidden import', () => {
    // A guard against a rule that cannot fail: the model may not import the DICOM reader.
    const fake = importsOf(join(SRC, 'dicom', 'index.ts')).map((i) => ({ ...i, folder: 'model' }));
    expect(fake.some(({ folder, target }) => !ALLOWED[folder]!.includes(target))).toBe(true);
  });
});
