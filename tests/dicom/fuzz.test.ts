/**
 * Robustness: 2 000 seeded mutants of the demo plans (bit flips, truncation, corrupted lengths and
 * VRs). Every mutant must either import to a valid model or be refused with typed issues: no
 * uncaught exception, and none may take more than a second.
 */
import { readFileSync } from 'node:fs';
import dicomParser from 'dicom-parser';
import { describe, expect, it } from 'vitest';
import { importPlanBytes } from '../../src/dicom/index.js';
import { Plan } from '../../src/model/index.js';
import { checkPlan, DEFAULT_POLICY } from '../../src/check/index.js';
import { demoPlan } from '../helpers/fixtures.js';
import { INTERNALS } from '../helpers/internals.js';
import { DEMO_MANIFEST, machine } from '../helpers/machines.js';

const CHECK_OPTIONS = { machine: machine(DEMO_MANIFEST), policy: DEFAULT_POLICY, aliases: new Map<string, string>(), suggestPoint: false };

/** mulberry32: a small, well-known seeded PRNG, so a failure can be replayed from its seed. */
function prng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

interface Source {
  readonly name: string;
  readonly bytes: Buffer;
  /** Byte offsets of element headers (tag) with their header size, for length and VR corruption. */
  readonly headers: readonly { at: number; dataOffset: number }[];
}

function load(name: string): Source {
  const bytes = readFileSync(demoPlan(name));
  const headers: { at: number; dataOffset: number }[] = [];
  const walk = (ds: dicomParser.DataSet) => {
    for (const el of Object.values(ds.elements)) {
      // explicit VR LE: 8-byte header for short VRs, 12 for OB/SQ/UN/UT…
      headers.push({
        at: el.dataOffset - (el.vr === 'SQ' || el.vr === 'OB' || el.vr === 'UN' || el.vr === 'UT' ? 12 : 8),
        dataOffset: el.dataOffset,
      });
      for (const it of el.items ?? []) if (it.dataSet) walk(it.dataSet);
    }
  };
  walk(dicomParser.parseDicom(bytes));
  return { name, bytes, headers: headers.filter((h) => h.at >= 132) };
}

const SOURCES = ['four-field-box.dcm', 'mlc-conformal.dcm', 'wedged-pair.dcm', 'electron-applicator.dcm', 'two-phase.dcm', 'two-arc-vmat.dcm'].map(
  load,
);
const KNOWN_CODES = new Set([
  'not-dicom',
  'not-rt-plan',
  'unsupported-transfer-syntax',
  'truncated',
  'length-past-end',
  'too-large',
  'missing-attribute',
  'empty-attribute',
  'invalid-number',
  'invalid-value',
  'wrong-multiplicity',
  'unknown-reference',
  'duplicate',
  'physical-range',
  'meterset-weight-decreasing',
  'jaws-crossed',
  'leaves-crossed',
  'inconsistent',
  'unreadable',
]);

type Mutation = 'bit-flips' | 'truncation' | 'length' | 'vr';
const MUTATIONS: readonly Mutation[] = ['bit-flips', 'truncation', 'length', 'vr'];

function mutate(src: Source, kind: Mutation, rnd: () => number): Buffer {
  const b = Buffer.from(src.bytes);
  const pick = (n: number) => Math.floor(rnd() * n);
  switch (kind) {
    case 'bit-flips':
      for (let k = 1 + pick(8); k > 0; k--) {
        const i = pick(b.length);
        b[i] = b[i]! ^ (1 << pick(8));
      }
      return b;
    case 'truncation':
      return b.subarray(0, pick(b.length));
    case 'length': {
      const h = src.headers[pick(src.headers.length)]!;
      const long = h.dataOffset - h.at === 12;
      const values = [0, 1, 0xffff, 0xfffe, pick(0x10000)];
      if (long) b.writeUInt32LE(rnd() < 0.3 ? 0xffffffff : pick(0x100000000), h.at + 8);
      else b.writeUInt16LE(values[pick(values.length)]!, h.at + 6);
      return b;
    }
    case 'vr': {
      const h = src.headers[pick(src.headers.length)]!;
      const vrs = ['SQ', 'OB', 'UN', 'FL', 'FD', 'US', 'UL', 'DS', 'IS', 'CS', 'ZZ', '\0\0'];
      b.write(vrs[pick(vrs.length)]!, h.at + 4, 'latin1');
      return b;
    }
  }
}

describe('seeded mutation of the demo plans', () => {
  it('2 000 mutants: each imports to a valid model or yields typed issues, each within a second', () => {
    const rnd = prng(20261202);
    const tally = { accepted: 0, refused: 0 };
    let slowest = 0;
    for (let n = 0; n < 2000; n++) {
      // The large arc plan is slower to mutate and read; give it one mutant in ten.
      const src = n % 10 === 9 ? SOURCES[5]! : SOURCES[n % 5]!;
      const kind = MUTATIONS[n % MUTATIONS.length]!;
      const bytes = mutate(src, kind, rnd);
      const t0 = performance.now();
      let r: ReturnType<typeof importPlanBytes>;
      try {
        r = importPlanBytes(bytes, `${src.name}#${n}`);
      } catch (e) {
        throw new Error(`mutant ${n} (${kind} of ${src.name}) threw: ${String(e)}`);
      }
      const ms = performance.now() - t0;
      slowest = Math.max(slowest, ms);
      expect(ms, `mutant ${n} (${kind} of ${src.name})`).toBeLessThan(1000);
      if (r.ok) {
        tally.accepted++;
        expect(Plan.safeParse(r.value.plan).success).toBe(true);
        // What imports is checked: the check and its verdict never throw on a plan the reader accepted.
        const checked = checkPlan(r.value.plan, { path: `mutant-${n}.dcm`, sha256: '0' }, CHECK_OPTIONS);
        expect(checked.verdict, `mutant ${n}`).toBeDefined();
        for (const i of checked.issues) expect(i.message, `mutant ${n}`).not.toMatch(INTERNALS);
      } else {
        tally.refused++;
        expect(r.issues.length).toBeGreaterThan(0);
        for (const i of r.issues) {
          expect(KNOWN_CODES.has(i.code), `mutant ${n}: code ${i.code}`).toBe(true);
          expect(i.message.length).toBeGreaterThan(0);
          expect(i.message, `mutant ${n}`).not.toMatch(INTERNALS);
          expect(i.severity === 'error' || i.severity === 'warning').toBe(true);
        }
        expect(r.issues.some((i) => i.severity === 'error')).toBe(true);
      }
    }
    // Both outcomes must occur, or the mutations are not reaching the reader.
    expect(tally.accepted).toBeGreaterThan(50);
    expect(tally.refused).toBeGreaterThan(500);
    console.log(`mutants: ${tally.accepted} accepted, ${tally.refused} refused, slowest ${slowest.toFixed(1)} ms`);
  });
});
