import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { basename } from 'node:path';
import type { Issue, Result } from '../model/index.js';

/**
 * A beam-data table from water-tank scans exported as plain text, each a list of (position, reading)
 * pairs in two columns (or the columns named). Depth scans (PDD, TMR), one per field side: each is
 * normalised (to its maximum, or to its reading at a stated depth) and resampled onto the table's
 * depths, one column per field. Profiles (OAR), one per depth: each is normalised on the central
 * axis, its two halves averaged where both were scanned, and resampled onto the table's off-axis
 * distances, one row per depth. The CSV names every source file and its SHA-256 in a comment.
 */
export interface ScanImport {
  readonly quantity: 'pdd' | 'tmr' | 'oar';
  /** The scan's place in the table (cm): the field side of a depth scan, the depth of a profile. */
  readonly scans: readonly { readonly atCm: number; readonly file: string }[];
  /** Where each scan is resampled (cm): the depths of a depth scan, the off-axis distances of a profile. */
  readonly gridCm: readonly number[];
  /** Depth scans: 'max' (dmax), or a depth in cm (d0 of a TMR normalised elsewhere). Profiles: always the central axis. */
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

/** A profile's reading at an off-axis distance: the mean of both sides where both were scanned. */
function profileAt(s: Scan, x: number): number | undefined {
  const [right, left] = [at(s, x), at(s, -x)];
  if (right !== undefined && left !== undefined) return (right + left) / 2;
  return right ?? left;
}

/** The table as CSV text, or why it cannot be built (a file unreadable, a row beyond a scan). */
export function importScans(o: ScanImport): Result<string> {
  const columns = o.columns ?? [1, 2];
  const lines: number[][] = [];
  const sources: string[] = [];
  const profile = o.quantity === 'oar';
  for (const s of [...o.scans].sort((a, b) => a.atCm - b.atCm)) {
    let scan: Result<Scan>;
    try {
      scan = readScan(s.file, columns, o.positionUnit ?? 'cm');
    } catch (e) {
      return refuse(s.file, `cannot be read (${(e as NodeJS.ErrnoException).code ?? String(e)})`);
    }
    if (!scan.ok) return scan;
    const read = profile ? profileAt : at;
    const norm = profile ? profileAt(scan.value, 0) : o.normalizeAt === 'max' ? Math.max(...scan.value.y) : at(scan.value, o.normalizeAt);
    if (!norm || !(norm > 0))
      return refuse(s.file, `has no positive reading at the normalisation point (${profile ? 'the central axis' : o.normalizeAt})`);
    const unit = o.quantity === 'pdd' ? 100 : 1;
    const line: number[] = [];
    for (const r of o.gridCm) {
      const v = read(scan.value, r);
      if (v === undefined) return refuse(s.file, `does not reach ${r} cm (it spans ${scan.value.x[0]} to ${scan.value.x.at(-1)} cm)`);
      line.push((unit * v) / norm);
    }
    lines.push(line);
    sources.push(`# ${s.atCm} cm: ${basename(s.file)}, SHA-256 ${createHash('sha256').update(readFileSync(s.file)).digest('hex')}`);
  }
  const keys = [...o.scans].map((s) => s.atCm).sort((a, b) => a - b);
  const digits = o.quantity === 'pdd' ? 2 : 4;
  const text = profile
    ? [
        '# OAR built by plumbline beams import-scans, each profile normalised on the central axis, both halves averaged, from:',
        ...sources,
        `depth_cm\\offaxis_cm,${o.gridCm.join(',')}`,
        ...keys.map((d, i) => `${d},${lines[i]!.map((v) => v.toFixed(digits)).join(',')}`),
      ]
    : [
        `# ${o.quantity === 'pdd' ? 'PDD (%)' : 'TMR'} built by plumbline beams import-scans, normalised at ` +
          `${o.normalizeAt === 'max' ? 'the maximum' : `${o.normalizeAt} cm`}, from:`,
        ...sources,
        `depth_cm\\field_cm,${keys.join(',')}`,
        ...o.gridCm.map((r, i) => `${r},${lines.map((c) => c[i]!.toFixed(digits)).join(',')}`),
      ];
  return { ok: true, value: `${text.join('\n')}\n` };
}

function refuse(file: string, message: string): { ok: false; issues: Issue[] } {
  return { ok: false, issues: [{ severity: 'error', code: 'invalid-table', file, message }] };
}
