/**
 * The one direction of flow (DICOM → model → geometry → physics → check → report → run → cli and
 * service), enforced on the import statements of src/: each folder may import only what the
 * architecture allows. Every folder of src/ must have a rule.
 */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const SRC = fileURLToPath(new URL('../src/', import.meta.url));

/** Node's built-ins, for the layers that do I/O. */
const NODE = [
  'node:fs',
  'node:path',
  'node:url',
  'node:os',
  'node:crypto',
  'node:worker_threads',
  'node:net',
  'node:http',
  'node:https',
  'node:stream',
  'node:readline',
];

const ALLOWED: Readonly<Record<string, readonly string[]>> = {
  model: ['model', 'zod'],
  dicom: ['model', 'dicom', 'dicom-parser', 'node:zlib', 'node:fs', 'node:url', 'node:worker_threads'], // a second thread reads CT pixels
  geometry: ['model', 'geometry'],
  beamdata: ['model', 'beamdata', 'zod', 'node:fs', 'node:path'],
  physics: ['model', 'physics'],
  check: ['model', 'geometry', 'physics', 'beamdata', 'check', 'zod'],
  report: ['model', 'report', 'zod'],
  // The application layer both front doors share: loads inputs, checks files, builds documents.
  run: ['model', 'dicom', 'geometry', 'beamdata', 'physics', 'check', 'report', 'run', 'zod', ...NODE],
  // The command line; it may start the service (its `receive`, `watch`, `serve`, `history` commands).
  cli: ['model', 'report', 'run', 'service', 'cli', 'zod', 'commander', 'cli-progress', ...NODE],
  // Intake, the record and the page: never the command line, never below the application layer.
  service: ['model', 'report', 'run', 'service', 'zod', 'dcmjs-dimse', 'better-sqlite3', 'pg', ...NODE],
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
        .filter(
          ({ folder, target }) => ALLOWED[folder] !== undefined && !ALLOWED[folder]!.includes(target) && !(target === 'errors' && folder !== 'model'),
        )
        .map(({ target }) => `${relative(SRC, f)} imports ${target}`),
    );
    expect(violations).toEqual([]);
  });

  it('every folder of src/ has a rule', () => {
    const folders = readdirSync(SRC).filter((n) => statSync(join(SRC, n)).isDirectory());
    expect(folders.filter((f) => ALLOWED[f] === undefined)).toEqual([]);
  });

  it('no DICOM tag literal appears outside src/dicom', () => {
    const offenders = all.filter((f) => !relative(SRC, f).startsWith(`dicom${sep}`) && /['"`]x[0-9a-f]{8}['"`]/.test(readFileSync(f, 'utf8')));
    expect(offenders.map((f) => relative(SRC, f))).toEqual([]);
  });

  // Guards against rules that cannot fail: a real file's imports, judged as if it sat in another folder.
  const forbidden = (file: string, as: string) => importsOf(join(SRC, file)).some(({ target }) => !ALLOWED[as]!.includes(target));
  it('the checker notices the model importing the DICOM reader', () => expect(forbidden('dicom/index.ts', 'model')).toBe(true));
  it('the checker notices the service importing the command line', () => expect(forbidden('cli/main.ts', 'service')).toBe(true));
  it('the checker notices the service reaching below the application layer', () => expect(forbidden('run/check-file.ts', 'service')).toBe(true));
  it('the checker notices the command line reaching below the application layer', () => expect(forbidden('run/manual-calc.ts', 'cli')).toBe(true));
  it('the checker notices the application layer importing a front door', () => expect(forbidden('cli/check.ts', 'run')).toBe(true));
});
