/**
 * `beams new` writes what a physicist fills: refused by validation until filled, accepted once the
 * values are entered. Filled here with the demo machine's values (its tables interpolated at the
 * template's grid points; invented data, for this test only).
 */
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { mkdirSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { loadMachine } from '../../src/beamdata/index.js';
import type { LookupLog, TableLookup } from '../../src/model/index.js';
import { beamDataTemplate, validateMachine } from '../../src/run/index.js';
import { DEMO_MANIFEST } from '../helpers/machines.js';

const demo = (() => {
  const r = loadMachine(DEMO_MANIFEST);
  if (!r.ok) throw new Error('demo');
  return r.value;
})();

/** Every empty cell of a template CSV filled from a table of the demo machine. */
function fill(text: string, table: TableLookup, round = 4): string {
  const log: LookupLog = [];
  let header: number[] | undefined;
  return text
    .split('\n')
    .map((line) => {
      if (line.startsWith('#') || !line.trim()) return line;
      const cells = line.split(',');
      if (!header) {
        header = cells.slice(1).map(Number);
        return line;
      }
      const row = Number(cells[0]);
      const values = header.every(Number.isNaN) ? [table.at(row, 0, log)] : header.map((c) => table.at(row, c, log));
      return [cells[0], ...values.map((v) => v.toFixed(round))].join(',');
    })
    .join('\n');
}

describe('a new machine from beams new', () => {
  const dir = mkdtempSync(join(tmpdir(), 'plumbline-new-'));
  const files = beamDataTemplate({ machine: 'LINAC2', photonsMV: [6], electronsMeV: [6], applicators: [{ id: 'A10', sideCm: 10 }] });
  for (const f of files) {
    mkdirSync(dirname(join(dir, f.path)), { recursive: true });
    writeFileSync(join(dir, f.path), f.content);
  }
  const manifestFile = join(dir, 'manifest.json');

  it('is refused by validation as written, each value still to fill named', () => {
    const v = validateMachine(manifestFile);
    expect(v.issues.filter((i) => i.severity === 'error').length).toBeGreaterThan(10);
    expect(v.issues.map((i) => i.path)).toContain('beams[0].calibration.doseCGyPerMu');
  });

  it("passes validation once filled with the demo machine's values", () => {
    const m = JSON.parse(readFileSync(manifestFile, 'utf8'));
    const d = demo.manifest;
    const x6 = d.beams.find((b) => b.id === '6X')!;
    const e6 = d.electronBeams.find((b) => b.id === '6E')!;
    Object.assign(m, { dataVersion: 'test-1', approval: { approvedOn: '2026-12-03', approvedBy: 'test' } });
    m.machine.limits = d.machine.limits;
    m.machine.clinicalRange = d.machine.clinicalRange;
    Object.assign(m.beams[0], {
      calibration: x6.calibration,
      mlcTransmission: x6.mlcTransmission,
      dosimetricLeafGapMm: x6.dosimetricLeafGapMm,
      collimatorExchangeK: x6.collimatorExchangeK,
    });
    // The demo's tables are measured ones (not derived from the other), so they carry their SSD and depths.
    const pdd = x6.pdd as { ssdCm: number; normalizationDepthCm: number };
    const tpr = x6.tpr as { normalizationDepthCm: number };
    Object.assign(m.beams[0].pdd, { ssdCm: pdd.ssdCm, normalizationDepthCm: pdd.normalizationDepthCm });
    m.beams[0].tpr.normalizationDepthCm = tpr.normalizationDepthCm;
    m.electronBeams[0].calibration = e6.calibration;
    m.electronBeams[0].pdd.ssdCm = e6.pdd.ssdCm;
    writeFileSync(manifestFile, JSON.stringify(m));
    const px = demo.machine.beams.find((b) => b.id === '6X')!;
    const pe = demo.machine.electronBeams.find((b) => b.id === '6E')!;
    const a10 = pe.applicators.find((a) => a.id === 'A10')!;
    const tables: [string, TableLookup, number?][] = [
      ['6x/pdd.csv', px.pdd!, 2],
      ['6x/tmr.csv', px.tpr!],
      ['6x/sc.csv', px.sc],
      ['6x/sp.csv', px.sp!],
      ['6x/oar.csv', px.oar!],
      ['6e/pdd.csv', pe.pdd, 2],
      ['6e/se-a10.csv', a10.outputFactor],
      ['6e/ssd-eff-a10.csv', a10.effectiveSsdCm as TableLookup, 1],
    ];
    for (const [file, table, round] of tables) writeFileSync(join(dir, file), fill(readFileSync(join(dir, file), 'utf8'), table, round));
    const v = validateMachine(manifestFile);
    expect(v.issues.filter((i) => i.severity === 'error')).toEqual([]);
  });
});
