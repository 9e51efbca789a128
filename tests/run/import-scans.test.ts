/**
 * A table from water-tank scans: the demo machine's 6 MV PDD written out as scans (readings in
 * arbitrary units, every 1 mm, a header line as tank software writes one) and rebuilt within 0.1 %.
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseCsvTable } from '../../src/beamdata/index.js';
import type { LookupLog, PhotonBeamModel } from '../../src/model/index.js';
import { importScans } from '../../src/run/index.js';
import { DEMO_MANIFEST, beam, machine } from '../helpers/machines.js';

const x6 = beam(machine(DEMO_MANIFEST), '6X') as PhotonBeamModel;
const dir = mkdtempSync(join(tmpdir(), 'plumbline-scans-'));
const FIELDS = [5, 10, 20];
const DEPTHS = [0, 0.5, 1, 1.5, 2, 3, 5, 7.5, 10, 15, 20, 25, 30];

/** A scan as a tank exports it: a header, then "depth_mm<TAB>reading", the reading in nC (any scale). */
function writeScan(fieldCm: number): string {
  const log: LookupLog = [];
  const lines = ['Depth [mm]\tCharge [nC]'];
  for (let mm = 0; mm <= 300; mm++) lines.push(`${mm}\t${(0.0427 * x6.pdd!.at(mm / 10, fieldCm, log)).toFixed(6)}`);
  const file = join(dir, `pdd-${fieldCm}x${fieldCm}.txt`);
  writeFileSync(file, `${lines.join('\n')}\n`);
  return file;
}

describe('importing scans', () => {
  const scans = FIELDS.map((fieldCm) => ({ atCm: fieldCm, file: writeScan(fieldCm) }));

  it("rebuilds the demo's 6 MV PDD within 0.1 %, naming each source file with its SHA-256", () => {
    const r = importScans({ quantity: 'pdd', scans, gridCm: DEPTHS, normalizeAt: 'max', positionUnit: 'mm' });
    if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
    expect(r.value).toMatch(/# 10 cm: pdd-10x10\.txt, SHA-256 [0-9a-f]{64}/);
    const out = join(dir, 'pdd.csv');
    writeFileSync(out, r.value);
    const t = parseCsvTable(readFileSync(out, 'utf8'), out, 'grid');
    if (!t.ok) throw new Error('unreadable table');
    const log: LookupLog = [];
    t.value.rows.forEach((d, i) =>
      FIELDS.forEach((f, j) => {
        const rebuilt = t.value.values[i * FIELDS.length + j]!;
        expect(Math.abs(rebuilt - x6.pdd!.at(d, f, log)) / x6.pdd!.at(d, f, log)).toBeLessThan(0.001);
      }),
    );
  });

  it('refuses a depth beyond a scan, naming the file', () => {
    const r = importScans({ quantity: 'pdd', scans, gridCm: [...DEPTHS, 35], normalizeAt: 'max', positionUnit: 'mm' });
    expect(!r.ok && r.issues[0]).toMatchObject({ file: scans[0]!.file, message: expect.stringMatching(/does not reach 35 cm/) });
  });
});

describe('importing profiles', () => {
  const PROFILE_DEPTHS = [1.5, 5, 10, 20];
  const POSITIONS = [0, 1, 2, 3, 4, 5, 6, 8, 10, 12, 14, 16, 18, 20];
  /** A profile across the beam, both sides, every 1 mm; one side reading 1 % high and the other 1 % low (a tilted tank). */
  function writeProfile(depthCm: number): string {
    const log: LookupLog = [];
    const lines = ['Position [mm]\tCharge [nC]'];
    for (let mm = -200; mm <= 200; mm++) {
      const tilt = mm > 0 ? 1.01 : mm < 0 ? 0.99 : 1;
      lines.push(`${mm}\t${(0.0311 * tilt * x6.oar!.at(depthCm, Math.abs(mm) / 10, log)).toFixed(7)}`);
    }
    const file = join(dir, `profile-${depthCm}cm.txt`);
    writeFileSync(file, `${lines.join('\n')}\n`);
    return file;
  }
  it("rebuilds the demo's 6 MV OAR within 0.1 % from both halves of each profile, normalised on the axis", () => {
    const scans = PROFILE_DEPTHS.map((d) => ({ atCm: d, file: writeProfile(d) }));
    const r = importScans({ quantity: 'oar', scans, gridCm: POSITIONS, normalizeAt: 'max', positionUnit: 'mm' });
    if (!r.ok) throw new Error(r.issues.map((i) => i.message).join('; '));
    expect(r.value).toMatch(/^depth_cm\\offaxis_cm,0,1,2,/m);
    const t = parseCsvTable(r.value, 'oar.csv', 'grid');
    if (!t.ok) throw new Error('unreadable table');
    const log: LookupLog = [];
    expect([...t.value.rows]).toEqual(PROFILE_DEPTHS);
    t.value.rows.forEach((d, i) =>
      POSITIONS.forEach((x, j) => {
        const want = x6.oar!.at(d, x, log);
        expect(Math.abs(t.value.values[i * POSITIONS.length + j]! - want) / want).toBeLessThan(0.001);
      }),
    );
  });
});
