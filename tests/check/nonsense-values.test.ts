/**
 * Well-formed nonsense, seeded: every numeric and coded attribute of the demo plans (their beams,
 * control points, fraction groups, dose references) set in turn to a value no planning system
 * writes — NaN, ±Infinity, ±1e300, ±1e9, a blank, a NUL — written as valid DICOM by dcmjs and put
 * through the whole check and its report. Project rules: nothing throws, no message quotes a
 * library's internals, none takes 2 s, and a mutant whose nonsense reached what the check reads is
 * never "within tolerance".
 */
import { describe, expect, it } from 'vitest';
import { checkPlan, DEFAULT_POLICY } from '../../src/check/index.js';
import { importPlanBytes } from '../../src/dicom/index.js';
import { checkSummary } from '../../src/report/check-summary.js';
import { checkText } from '../../src/report/check-text.js';
import type { CheckDocument } from '../../src/report/check-json.js';
import { CAUTION } from '../../src/report/caution.js';
import { datasetBytes, RT_PLAN_STORAGE } from '../../scripts/lib/dcmjs-writer.js';
import { DEMO_PLAN_SPECS } from '../../scripts/fixtures/demo-plans.js';
import { planDataset } from '../../scripts/fixtures/plan-parts.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';
import { INTERNALS } from '../helpers/internals.js';

const demo = machine(DEMO_MANIFEST);
const NUMERIC_NONSENSE = ['NaN', 'Infinity', '-Infinity', '1e300', '-1e300', '1e9', '-1e9'];
const CODED_NONSENSE = ['', '\0', '  '];

/** Where a value lives in a naturalized dataset: keys and indices down to it. */
type Path = readonly (string | number)[];

/** Every numeric (DS, IS written as text or numbers) and coded (CS-like upper-case text) value, by path. */
function leaves(x: unknown, path: Path = []): { path: Path; kind: 'numeric' | 'coded' }[] {
  if (Array.isArray(x)) return x.flatMap((v, i) => leaves(v, [...path, i]));
  if (x && typeof x === 'object') {
    return Object.entries(x).flatMap(([k, v]) =>
      k.startsWith('_') || /UID$|Date$|Time$|Name$|Label$|Description$|ID$/.test(k) ? [] : leaves(v, [...path, k]),
    );
  }
  if (typeof x === 'number' || (typeof x === 'string' && /^[-+]?\d*\.?\d+(e[-+]?\d+)?$/i.test(x.trim()))) return [{ path, kind: 'numeric' }];
  if (typeof x === 'string' && /^[A-Z][A-Z0-9_ ]*$/.test(x)) return [{ path, kind: 'coded' }];
  return [];
}

function setAt(root: any, path: Path, value: unknown): void {
  let o = root;
  for (const k of path.slice(0, -1)) o = o[k];
  o[path[path.length - 1]!] = value;
}

function prng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

const SOURCES = DEMO_PLAN_SPECS.map((spec) => {
  const ds = planDataset(spec);
  const imported = importPlanBytes(datasetBytes(ds, RT_PLAN_STORAGE), spec.file);
  if (!imported.ok) throw new Error(`${spec.file} does not import`);
  return { name: spec.file, spec, leaves: leaves(ds), model: JSON.stringify(imported.value.plan) };
});

function document(plans: CheckDocument['plans']): CheckDocument {
  return {
    schemaVersion: 5,
    kind: 'plumbline.check',
    tool: { name: 'plumbline', version: 'test' },
    createdAt: '2026-12-03T00:00:00Z',
    deviationDefinition: '(independent − planning system) / planning system',
    beamData: { manifest: 'demo', sha256: '0', machine: demo.name, dataVersion: demo.version, invented: true, validationWarnings: 0 },
    policy: { levels: {} },
    plans,
    refused: [],
    summary: checkSummary(plans, []),
    caution: CAUTION,
  };
}

/** One batch of mutants from its own seed; the tally of what became of them. */
function runBatch(seed: number, count: number) {
  const rnd = prng(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(rnd() * xs.length)]!;
  const tally = { refused: 0, checked: 0, unchanged: 0, notWritable: 0 };
  for (let n = 0; n < count; n++) {
    // The two-arc plan (356 control points) takes dcmjs a quarter of a second to write: one mutant in a hundred.
    const src = n % 100 === 99 ? SOURCES[5]! : SOURCES[n % 5]!;
    const leaf = pick(src.leaves);
    const value = pick(leaf.kind === 'numeric' ? NUMERIC_NONSENSE : CODED_NONSENSE);
    const ds = structuredClone(planDataset(src.spec));
    setAt(ds, leaf.path, value);
    let bytes: Buffer;
    try {
      bytes = datasetBytes(ds, RT_PLAN_STORAGE);
    } catch {
      tally.notWritable++; // dcmjs refuses to encode it: no file, nothing to check
      continue;
    }
    const what = `mutant ${n}: ${src.name} ${leaf.path.join('.')} = ${JSON.stringify(value)}`;
    const t0 = performance.now();
    const r = importPlanBytes(bytes, `${src.name}#${n}`);
    if (!r.ok) {
      tally.refused++;
      for (const i of r.issues) expect(i.message, what).not.toMatch(INTERNALS);
      continue;
    }
    const result = checkPlan(
      r.value.plan,
      { path: `mutant-${n}.dcm`, sha256: '0', importWarnings: r.warnings ?? [] },
      {
        machine: demo,
        policy: DEFAULT_POLICY,
        aliases: new Map(),
        suggestPoint: false,
      },
    );
    const text = checkText(document([result])).join('\n');
    expect(performance.now() - t0, what).toBeLessThan(2000);
    expect(text, what).not.toMatch(INTERNALS);
    if (JSON.stringify(r.value.plan) === src.model) {
      tally.unchanged++; // the nonsense sits where the check reads nothing
      continue;
    }
    tally.checked++;
    if (result.issues.length === 0) expect(result.verdict, what).not.toBe('within tolerance');
  }
  return tally;
}

describe('well-formed nonsense in every numeric and coded attribute: 2 000 mutants in four batches', () => {
  for (const seed of [20261203, 20261204, 20261205, 20261206]) {
    it(`500 mutants (seed ${seed}) through import, check and report: no throw, no internals, no hang, no "within tolerance" from nonsense`, () => {
      const tally = runBatch(seed, 500);
      // Most nonsense is refused at the door; some sits where the check reads nothing; some is checked and flagged.
      expect(tally.refused).toBeGreaterThan(250);
      expect(tally.refused + tally.checked + tally.unchanged + tally.notWritable).toBe(500);
      console.log(`nonsense batch ${seed}: ${JSON.stringify(tally)}`);
    }, 120_000);
  }
});
