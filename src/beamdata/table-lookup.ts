import type { LookupLog, TableAxis, TableLookup } from '../model/index.js';

export interface ClampAllowance {
  /** How far beyond each edge a lookup may be clamped to the edge value, in the axis's unit. */
  readonly rowsBelow?: number;
  readonly rowsAbove?: number;
  readonly columnsBelow?: number;
  readonly columnsAbove?: number;
}

export interface TableSpec {
  readonly name: string;
  readonly rows: TableAxis;
  readonly columns?: TableAxis;
  /** Row-major, rows.length × columns.length (or rows.length for a profile). */
  readonly values: Float64Array;
  /** 'log-linear-rows': interpolate the logarithm along the rows (depth), linearly along columns. */
  readonly interpolation: 'bilinear' | 'log-linear-rows';
  readonly clamp?: ClampAllowance;
}

const EXACT = 1e-9;

/**
 * Builds the interpolator of one table, once: bilinear by default. The valid range travels with
 * the table; outside it the lookup gives NaN and an 'out-of-range' note, unless the table's stated
 * clamp allows the edge value (then a 'clamped' note). Axes must be strictly increasing (checked by
 * the loader). No allocation unless a note is written.
 */
export function makeTableLookup(spec: TableSpec): TableLookup {
  const { rows, columns, values, name } = spec;
  const logRows = spec.interpolation === 'log-linear-rows';
  const c = spec.clamp ?? {};
  const nc = columns ? columns.values.length : 1;

  const along = (axis: TableAxis, v: number, below: number, above: number, log: LookupLog): number => {
    const a = axis.values;
    const lo = a[0]!;
    const hi = a[a.length - 1]!;
    if (v >= lo - EXACT && v <= hi + EXACT) return Math.min(Math.max(v, lo), hi);
    const edge = v < lo ? lo : hi;
    const allowed = v < lo ? lo - v <= below + EXACT : v - hi <= above + EXACT;
    log.push({
      table: name,
      axis: axis.name,
      requested: v,
      used: allowed ? edge : Number.NaN,
      kind: allowed ? 'clamped' : 'out-of-range',
      range: [lo, hi],
      unit: axis.unit,
    });
    return allowed ? edge : Number.NaN;
  };

  /** Index i with a[i] <= v <= a[i+1] (i = n - 2 at the top edge); -1 for a single-point axis. */
  const bracket = (a: Float64Array, v: number): number => {
    const n = a.length;
    if (n === 1) return -1;
    let lo = 0;
    let hi = n - 1;
    while (hi - lo > 1) {
      const mid = (lo + hi) >> 1;
      if (a[mid]! <= v) lo = mid;
      else hi = mid;
    }
    return lo;
  };

  const interp1 = (v0: number, v1: number, t: number, useLog: boolean): number =>
    useLog && v0 > 0 && v1 > 0 ? Math.exp(Math.log(v0) + t * (Math.log(v1) - Math.log(v0))) : v0 + t * (v1 - v0);

  const lookup: TableLookup = {
    name,
    rows,
    ...(columns ? { columns } : {}),
    at(row: number, column: number, log: LookupLog): number {
      if (!Number.isFinite(row) || (columns && !Number.isFinite(column))) {
        log.push({
          table: name,
          axis: Number.isFinite(row) ? columns!.name : rows.name,
          requested: Number.isFinite(row) ? column : row,
          used: Number.NaN,
          kind: 'out-of-range',
          range: [Number.NaN, Number.NaN],
          unit: '',
        });
        return Number.NaN;
      }
      const r = along(rows, row, c.rowsBelow ?? 0, c.rowsAbove ?? 0, log);
      if (Number.isNaN(r)) return Number.NaN;
      const ra = rows.values;
      const i = bracket(ra, r);
      const tr = i < 0 ? 0 : (r - ra[i]!) / (ra[i + 1]! - ra[i]!);
      const i0 = i < 0 ? 0 : i;
      const i1 = i < 0 ? 0 : i + 1;
      if (!columns) return interp1(values[i0]!, values[i1]!, tr, logRows);
      const col = along(columns, column, c.columnsBelow ?? 0, c.columnsAbove ?? 0, log);
      if (Number.isNaN(col)) return Number.NaN;
      const ca = columns.values;
      const j = bracket(ca, col);
      const tc = j < 0 ? 0 : (col - ca[j]!) / (ca[j + 1]! - ca[j]!);
      const j0 = j < 0 ? 0 : j;
      const j1 = j < 0 ? 0 : j + 1;
      const v0 = interp1(values[i0 * nc + j0]!, values[i1 * nc + j0]!, tr, logRows);
      const v1 = interp1(values[i0 * nc + j1]!, values[i1 * nc + j1]!, tr, logRows);
      return v0 + tc * (v1 - v0);
    },
    atRow(row: number, log: LookupLog): (column: number, log: LookupLog) => number {
      // A refused row stays refused by every lookup, each writing its note, as `at` does.
      const notes: LookupLog = [];
      const r = Number.isFinite(row) ? along(rows, row, c.rowsBelow ?? 0, c.rowsAbove ?? 0, notes) : Number.NaN;
      if (!columns || Number.isNaN(r)) return (column, l) => lookup.at(row, column, l);
      log.push(...notes);
      // The same arithmetic as `at`, the row's part done once per column.
      const ra = rows.values;
      const i = bracket(ra, r);
      const tr = i < 0 ? 0 : (r - ra[i]!) / (ra[i + 1]! - ra[i]!);
      const i0 = i < 0 ? 0 : i;
      const i1 = i < 0 ? 0 : i + 1;
      const slice = new Float64Array(nc);
      for (let j = 0; j < nc; j++) slice[j] = interp1(values[i0 * nc + j]!, values[i1 * nc + j]!, tr, logRows);
      const ca = columns.values;
      return (column: number, l: LookupLog): number => {
        if (!Number.isFinite(column)) return lookup.at(row, column, l);
        const col = along(columns, column, c.columnsBelow ?? 0, c.columnsAbove ?? 0, l);
        if (Number.isNaN(col)) return Number.NaN;
        const j = bracket(ca, col);
        const tc = j < 0 ? 0 : (col - ca[j]!) / (ca[j + 1]! - ca[j]!);
        const v0 = slice[j < 0 ? 0 : j]!;
        const v1 = slice[j < 0 ? 0 : j + 1]!;
        return v0 + tc * (v1 - v0);
      };
    },
  };
  return lookup;
}
