/**
 * The one direction of flow (DICOM → model → geometry → physics → check → report → run → cli and
 * service), enforced on the import statements of src/: each folder may import only what the
 * architecture allows. Every folder of src/ must have a rule.
 */
import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative, sep } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const SRC = fileURLToPath(new URL('../src/', import.meta.url));
const TESTS = fileURLToPath(new URL('./', import.meta.url));

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

/**
 * Modules that hold no logic of their own (types, schemas, the executable entry): a test of their
 * name is not asked of them; the schemas are exercised by every test that parses a document.
 */
const NO_LOGIC: Readonly<Record<string, string>> = {
  'cli/bin.ts': 'the executable entry: imports main and sets the exit code',
  'cli/outcome.ts': "a command's outcome type",
  'cli/zod-setup.ts': "one call configuring zod's parsing for the command line",
  'model/beam-depth.ts': 'schema of a depth row',
  'model/beam-model.ts': "types of the beam data's lookups",
  'model/beam.ts': 'schema of a beam',
  'model/check-result.ts': 'schema of a check result',
  'model/ct-volume.ts': 'type of a CT volume',
  'model/dose-grid.ts': 'type of an RT Dose grid',
  'model/dose-reference.ts': 'schema of a dose reference',
  'model/fraction-group.ts': 'schema of a fraction group',
  'model/issue-json.ts': 'schema of an issue in JSON',
  'model/plan.ts': 'schema of a plan',
  'model/point-dose.ts': 'types of the point-dose input and result',
  'model/structure.ts': 'type of a structure set',
  'model/vectors.ts': 'schemas of points and finite numbers',
  'report/check-json.ts': 'schema of the check document',
  'report/inspect-json.ts': 'schema of the inspect document',
  'service/history/store.ts': "the history store's interface",
};

/** Logic-holding modules of src/ without a test of their name under `testsRoot`. */
function withoutTest(testsRoot: string): string[] {
  return files(SRC)
    .map((f) => relative(SRC, f).split(sep).join('/'))
    .filter((rel) => !rel.endsWith('/index.ts') && rel !== 'index.ts' && !rel.endsWith('.d.ts') && NO_LOGIC[rel] === undefined)
    .filter((rel) => !existsSync(join(testsRoot, rel.replace(/\.ts$/, '.test.ts'))));
}

/** Code that does something: a function, a class, a branch or loop, a block-bodied arrow, a schema's refinement (comments stripped). */
const LOGIC = /\bfunction\b|\bclass\b|\b(?:if|for|while|switch)\s*\(|=>\s*[{(]|\.(?:refine|superRefine|transform)\(/;
const withoutComments = (text: string) => text.replace(/\/\*[\s\S]*?\*\//g, '').replace(/^\s*\/\/.*$/gm, '');

describe('tests mirror src/', () => {
  it('every module that holds logic has a test of its own name opposite it', () => {
    expect(withoutTest(TESTS)).toEqual([]);
  });
  it('a module said to hold no logic defines no function, class, branch, loop or refinement', () => {
    const offenders = Object.keys(NO_LOGIC).filter((rel) => LOGIC.test(withoutComments(readFileSync(join(SRC, rel), 'utf8'))));
    expect(offenders).toEqual([]);
  });
  it('every module said to hold no logic exists', () => {
    expect(Object.keys(NO_LOGIC).filter((rel) => !existsSync(join(SRC, rel)))).toEqual([]);
  });
  // Guards against rules that cannot fail.
  it('the checker notices modules without their tests (against an empty tests folder)', () => {
    expect(withoutTest(join(TESTS, 'no-such-folder')).length).toBeGreaterThan(100);
  });
  it('the checker notices logic in a module (the policy module, judged as if it were said to hold none)', () => {
    expect(LOGIC.test(withoutComments(readFileSync(join(SRC, 'check/policy.ts'), 'utf8')))).toBe(true);
  });
});
