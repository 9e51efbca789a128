import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import type { Issue, Result } from '../model/index.js';

/**
 * A beam-data table from water-tank scans exported as plain text: one file per field size, each a
 * list of (position, reading) pairs in two columns (or the columns named). Each scan is normalised
 * (to its maximum, or to its reading at a stated depth), resampled linearly onto the table's rows,
 * and the table is written as CSV with a comment naming every source file and its SHA-256.
 */
export interface ScanImport {
  readonly quantity: 'pdd' | 'tmr';
  /** Field side (cm) → scan file. */
  readonly scans: readonly { readonly fieldCm: number; readonly file: string }[];
  /** The table's depths (cm). */
  readonly rowsCm: readonly number[];
  /** 'max' (dmax), or a depth in cm (d0 of a TMR normalised elsewhere). */
  readonly normalizeAt: 'max' | number;
  /** 1-based columns of position and reading (default 1 and 2). */
  readonly columns?: readonly [number, number];
  /** The unit of the positions in the files. */
  readonly positionUnit?: 'cm' | 'mm';
}

type Scan = { readonly x: number[]; readonly y: number[] };

/** The numeric rows of a scan file: any line whose chosen columns read as numbers (headers and comments are skipped). */
function readScan(file: string, columns: readonly [number, number], unit: 'cm' | 'mm'): Result<Scan> {
  const pairs: [number, number][] = [];
  for (const line of readFileSync(file, 'utf8').split(/\r?\n/)) {
    const cells = line.trim().split(/[\s,;]+/);
    const [x, y] = [Number(cells[columns[0] - 1]), Number(cells[columns[1] - 1])];
    if (cells.length >= Math.max(...columns) && Number.isFinite(x) && Number.isFinite(y) && line.trim() !== '') pairs.push([x, y]);
  }
  pairs.sort((a, b) => a[0] - b[0]);
  if (pairs.length < 2) return refuse(file, 'holds fewer than two (position, reading) rows');
  const scale = unit === 'mm' ? 0.1 : 1;
  return { ok: true, value: { x: pairs.map((p) => p[0] * scale), y: pairs.map((p) => p[1]) } };
}

/** Linear interpolation inside the scan; undefined outside it. */
function at(s: Scan, x: number): number | undefined {
  if (x < s.x[0]! - 1e-9 || x > s.x.at(-1)! + 1e-9) return undefined;
  let i = 0;
  while (i < s.x.length - 2 && s.x[i + 1]! < x) i++;
  const [x0, x1] = [s.x[i]!, s.x[i + 1]!];
  const t = x1 === x0 ? 0 : (x - x0) / (x1 - x0);
  return s.y[i]! + t * (s.y[i + 1]! - s.y[i]!);
}

/** The table as CSV text, or why it cannot be built (a file unreadable, a row beyond a scan). */
export function importScans(o: ScanImport): Result<string> {
  const columns = o.columns ?? [1, 2];
  const byField: number[][] = [];
  const sources: string[] = [];
  for (const s of [...o.scans].sort((a, b) => a.fieldCm - b.fieldCm)) {
    let scan: Result<Scan>;
    try {
      scan = readScan(s.file, columns, o.positionUnit ?? 'cm');
    } catch (e) {
      return refuse(s.file, `cannot be read (${(e as NodeJS.ErrnoException).code ?? String(e)})`);
    }
    if (!scan.ok) return scan;
    const norm = o.normalizeAt === 'max' ? Math.max(...scan.value.y) : at(scan.value, o.normalizeAt);
    if (!norm || !(norm > 0)) return refuse(s.file, `has no positive reading at the normalisation point (${o.normalizeAt})`);
    const unit = o.quantity === 'pdd' ? 100 : 1;
    const column: number[] = [];
    for (const r of o.rowsCm) {
      const v = at(scan.value, r);
      if (v === undefined) return refuse(s.file, `does not reach ${r} cm (it spans ${scan.value.x[0]} to ${scan.value.x.at(-1)} cm)`);
      column.push((unit * v) / norm);
    }
    byField.push(column);
    sources.push(`# ${s.fieldCm} cm: ${basename(s.file)}, SHA-256 ${createHash('sha256').update(readFileSync(s.file)).digest('hex')}`);
  }
  const fields = [...o.scans].map((s) => s.fieldCm).sort((a, b) => a - b);
  const what = o.quantity === 'pdd' ? 'PDD (%)' : 'TMR';
  const corner = 'depth_cm\\field_cm';
  const digits = o.quantity === 'pdd' ? 2 : 4;
  const lines = [
    `# ${what} built by plumbline beams import-scans, normalised at ${o.normalizeAt === 'max' ? 'the maximum' : `${o.normalizeAt} cm`}, from:`,
    ...sources,
    `${corner},${fields.join(',')}`,
    ...o.rowsCm.map((r, i) => `${r},${byField.map((c) => c[i]!.toFixed(digits)).join(',')}`),
  ];
  return { ok: true, value: `${lines.join('\n')}\n` };
}

function refuse(file: string, message: string): { ok: false; issues: Issue[] } {
  return { ok: false, issues: [{ severity: 'error', code: 'invalid-table', file, message }] };
}
