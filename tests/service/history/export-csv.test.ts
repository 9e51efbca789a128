/** The chart-round CSV: fields a spreadsheet or a CSV reader must take as they are, read back by Python's csv module. */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import type { ChartRoundEntry } from '../../../src/service/history/chart-round.js';
import { chartRoundCsv, csvText } from '../../../src/service/history/export-csv.js';

const entry = (planLabel: string, patientId: string): ChartRoundEntry => ({
  check: {
    id: 7,
    recordedAt: '2026-12-01T09:00:00.000Z',
    planSopInstanceUid: '2.25.1',
    planSha256: 'a',
    planLabel,
    patientId,
    verdict: 'needs review',
    fullyVerified: false,
    toolVersion: 't',
    inputs: [],
  },
  worst: { beamNumber: 3, deviationPercent: -2.345 },
  reviews: [],
});

describe('the chart-round CSV', () => {
  it('quotes commas, quotes and line breaks (RFC 4180), and keeps a formula from being evaluated', () => {
    expect(csvText('plain')).toBe('plain');
    expect(csvText('a,b')).toBe('"a,b"');
    expect(csvText('say "hi"')).toBe('"say ""hi"""');
    expect(csvText('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvText('-1+1')).toBe("'-1+1");
  });
  it("reads back as written with Python's csv module, nasty plan labels included", () => {
    const labels = ['BREAST, LEFT', 'line\nbreak', 'quote "x"', '@SUM(A1)'];
    const file = join(mkdtempSync(join(tmpdir(), 'plumbline-csv-')), 'r.csv');
    writeFileSync(file, chartRoundCsv(labels.map((l) => entry(l, 'NG-1'))));
    const rows = JSON.parse(
      spawnSync('python3', ['-c', 'import csv, json, sys; print(json.dumps(list(csv.reader(open(sys.argv[1], newline="")))))', file], {
        encoding: 'utf8',
      }).stdout,
    ) as string[][];
    expect(rows).toHaveLength(5);
    expect(rows.slice(1).map((r) => r[3])).toEqual(['BREAST, LEFT', 'line\nbreak', 'quote "x"', "'@SUM(A1)"]);
    expect(rows[1]!.slice(7, 9)).toEqual(['3', '-2.35']);
  });
});
