/**
 * The same plans re-encoded by dcmtk's dcmconv in every transfer syntax and length encoding an RT
 * Plan arrives in, with and without the Part-10 header: all must import to the identical model.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { importPlanBytes, importPlanFile } from '../../src/dicom/index.js';
import { demoPlan } from '../helpers/fixtures.js';

const work = mkdtempSync(join(tmpdir(), 'plumbline-ts-'));
afterAll(() => rmSync(work, { recursive: true, force: true }));

const VARIANTS: readonly { name: string; args: readonly string[]; ts: string; header: boolean }[] = [
  { name: 'implicit VR LE, defined lengths', args: ['+ti', '+e'], ts: '1.2.840.10008.1.2', header: true },
  { name: 'implicit VR LE, undefined lengths', args: ['+ti', '-e'], ts: '1.2.840.10008.1.2', header: true },
  { name: 'explicit VR LE, defined lengths', args: ['+te', '+e'], ts: '1.2.840.10008.1.2.1', header: true },
  { name: 'explicit VR big endian', args: ['+tb'], ts: '1.2.840.10008.1.2.2', header: true },
  { name: 'deflated explicit VR LE', args: ['+td'], ts: '1.2.840.10008.1.2.1.99', header: true },
  { name: 'bare dataset, implicit VR LE (no preamble, no meta)', args: ['-F', '+ti'], ts: '1.2.840.10008.1.2', header: false },
  { name: 'bare dataset, explicit VR LE (no preamble, no meta)', args: ['-F', '+te', '-e'], ts: '1.2.840.10008.1.2.1', header: false },
];

const PLANS = ['four-field-box.dcm', 'wedged-pair.dcm', 'electron-applicator.dcm', 'two-arc-vmat.dcm'];

function dcmconv(src: string, args: readonly string[], out: string): void {
  const r = spawnSync('dcmconv', [...args, src, out], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`dcmconv ${args.join(' ')} failed: ${r.stderr}`);
}

describe.each(PLANS)('%s re-encoded by dcmtk dcmconv', (name) => {
  const original = importPlanFile(demoPlan(name));
  if (!original.ok) throw new Error(`fixture ${name} does not import`);

  it.each(VARIANTS.map((v) => [v.name, v] as const))('%s: identical model', (_label, v) => {
    const out = join(work, `${basename(name, '.dcm')}-${VARIANTS.indexOf(v)}.dcm`);
    dcmconv(demoPlan(name), v.args, out);
    const r = importPlanFile(out);
    expect(r.ok).toBe(true);
    if (!r.ok) return;
    expect(r.value.source.transferSyntaxUid).toBe(v.ts);
    expect(r.value.source.hasPart10Header).toBe(v.header);
    expect(r.value.plan).toEqual(original.value.plan);
  });

  it('meta information without the 128-byte preamble: identical model', () => {
    const bytes = readFileSync(demoPlan(name)).subarray(132); // drop preamble and "DICM"
    const r = importPlanBytes(bytes, `${name} without preamble`);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.value.plan).toEqual(original.value.plan);
  });
});

describe('deflated input that inflates beyond the limit', () => {
  it('is refused as too large, not read', () => {
    const out = join(work, 'deflated.dcm');
    dcmconv(demoPlan('two-arc-vmat.dcm'), ['+td'], out);
    const r = importPlanFile(out, { maxInflatedBytes: 10_000 });
    expect(r.ok).toBe(false);
    if (!r.ok) expect(r.issues[0]!.code).toBe('too-large');
  });
});
