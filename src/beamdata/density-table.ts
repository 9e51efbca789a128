import { readFileSync } from 'node:fs';
import type { Issue, Result } from '../model/index.js';
import { parseCsvTable } from './csv-table.js';
import { makeTableLookup } from './table-lookup.js';

export interface DensityTable {
  readonly file: string;
  readonly huRange: readonly [number, number];
  /** Relative electron density for an HU value, interpolated; NaN outside the table (never extrapolated). */
  density(hu: number): number;
}

/**
 * The clinic's CT calibration: a two-column CSV (HU, relative electron density), HU strictly
 * increasing, densities >= 0. HU outside its range are refused, not extrapolated.
 */
export function loadDensityTable(file: string): Result<DensityTable> {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (e) {
    return {
      ok: false,
      issues: [
        {
          severity: 'error',
          code: 'unreadable',
          file,
          message: `cannot read the HU to density table (${(e as NodeJS.ErrnoException).code ?? String(e)})`,
        },
      ],
    };
  }
  const csv = parseCsvTable(text, file, 'profile');
  if (!csv.ok) return csv;
  const t = csv.value;
  const issues: Issue[] = [];
  t.rows.forEach((hu, i) => {
    if (i > 0 && !(hu > t.rows[i - 1]!))
      issues.push({
        severity: 'error',
        code: 'invalid-table',
        file,
        ...t.rowPositions[i]!,
        message: 'the HU axis is not strictly increasing',
        found: `${hu}`,
      });
  });
  t.values.forEach((rho, i) => {
    if (!(rho >= 0) || rho > 5)
      issues.push({
        severity: 'error',
        code: 'physical-range',
        file,
        ...t.valuePositions[i]!,
        message: 'relative electron density outside 0 to 5',
        found: `${rho}`,
      });
  });
  if (t.rows.length < 2) issues.push({ severity: 'error', code: 'invalid-table', file, message: 'the table needs at least two rows' });
  if (issues.length) return { ok: false, issues };
  const lookup = makeTableLookup({
    name: `HU to density (${file})`,
    rows: { name: 'HU', unit: 'HU', values: Float64Array.from(t.rows) },
    values: Float64Array.from(t.values),
    interpolation: 'bilinear',
  });
  // HU are integers in a bounded range: precompute once, look up by index in the ray tracer's loop.
  const lo = Math.ceil(t.rows[0]!);
  const hi = Math.floor(t.rows[t.rows.length - 1]!);
  const cache = new Float64Array(hi - lo + 1);
  for (let h = lo; h <= hi; h++) cache[h - lo] = lookup.at(h, 0, []);
  return {
    ok: true,
    value: {
      file,
      huRange: [t.rows[0]!, t.rows[t.rows.length - 1]!],
      density: (hu: number) => (hu >= lo && hu <= hi ? cache[hu - lo]! : Number.NaN),
    },
    warnings: [],
  };
}
