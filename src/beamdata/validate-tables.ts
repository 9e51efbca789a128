import type { Issue } from '../model/index.js';
import type { LoadedMachine, LoadedTable } from './load-machine.js';

/** Physical ranges of each quantity, in the engine's units (PDD in percent). */
const RANGES: Readonly<Record<string, { min: number; max: number; minInclusive: boolean }>> = {
  pdd: { min: 0, max: 100.05, minInclusive: false },
  tpr: { min: 0, max: 1.5, minInclusive: false },
  tmr: { min: 0, max: 1.5, minInclusive: false },
  sc: { min: 0.5, max: 1.3, minInclusive: true },
  sp: { min: 0.5, max: 1.3, minInclusive: true },
  scp: { min: 0.4, max: 1.5, minInclusive: true },
  oar: { min: 0, max: 1.3, minInclusive: false },
  wedge: { min: 0, max: 1, minInclusive: false },
  'wedge profile': { min: 0, max: 3, minInclusive: false },
  'swept wedge': { min: 0, max: 1, minInclusive: false },
  'electron pdd': { min: 0, max: 100.05, minInclusive: true },
  se: { min: 0.5, max: 1.3, minInclusive: true },
  'effective ssd': { min: 50, max: 200, minInclusive: true },
};

/** The family of a table from its quantity name ("wedge W15" → wedge, "se A10" → se). */
function kindOf(quantity: string): string {
  if (quantity.startsWith('wedge profile') || quantity === 'swept wedge profile') return 'wedge profile';
  if (quantity.startsWith('wedge')) return 'wedge';
  if (quantity.startsWith('se ')) return 'se';
  if (quantity.startsWith('effective ssd')) return 'effective ssd';
  return quantity;
}

/** How far a value's departure may stand above its line's median before the table is called rough. */
const ROUGHNESS_RATIO = 10;
/** ... and it must also exceed this fraction of the value (noise-level wiggles are not flagged). */
const ROUGHNESS_FLOOR = 0.003;

/**
 * Checks that need only the tables themselves: physical ranges, the normalization row (PDD = 100 %
 * at its normalization depth, TPR = 1 at its), roughness (second differences far beyond the rest
 * of their row or column), and wedges that one energy has and another lacks. Every issue points at
 * file:line:column.
 */
export function validateTables(loaded: LoadedMachine): Issue[] {
  const issues: Issue[] = [];
  for (const t of loaded.tables) {
    const kind = kindOf(t.quantity);
    // A table in the wrong unit is one mistake, said once with its likely cause, not a complaint per cell.
    const slip = unitSlip(t, kind);
    if (slip) issues.push(slip);
    else checkRange(t, RANGES[kind]!, issues);
    // An electron PDD falls steeply past its therapeutic range: its curvature there is physics, not noise.
    if (kind !== 'electron pdd')
      checkRoughness(t, issues, kind === 'pdd' || kind === 'tpr' || kind === 'tmr' ? buildUpEndCm(loaded, t.beamId) : -Infinity);
    else checkColumnMaxima(t, issues);
  }
  for (const [i, b] of loaded.manifest.beams.entries()) {
    const find = (q: string) => loaded.tables.find((t) => t.beamId === b.id && t.quantity === q);
    if (b.pdd !== 'derive-from-tpr') checkNormalizationRow(find('pdd'), b.pdd.normalizationDepthCm, 100, 0.5, 'PDD', issues);
    if (b.tpr !== 'derive-from-pdd') checkNormalizationRow(find(b.tpr.kind.toLowerCase()), b.tpr.normalizationDepthCm, 1, 0.005, b.tpr.kind, issues);
    if (b.calibration.d0Cm < b.calibration.dmaxCm - 1e-9) {
      issues.push({
        severity: 'warning',
        code: 'physical-range',
        file: loaded.manifestFile,
        path: `beams[${i}].calibration.d0Cm`,
        message: `beam ${b.id}: the normalization depth lies in the build-up region, above dmax`,
        expected: `d0 >= ${b.calibration.dmaxCm} cm`,
        found: `${b.calibration.d0Cm} cm`,
      });
    }
  }
  const wedgeIds = new Set(loaded.manifest.beams.flatMap((b) => b.wedges.map((w) => w.id)));
  for (const id of wedgeIds) {
    const without = loaded.manifest.beams.filter((b) => !b.wedges.some((w) => w.id === id)).map((b) => b.id);
    if (without.length) {
      issues.push({
        severity: 'warning',
        code: 'missing-table',
        file: loaded.manifestFile,
        message: `wedge ${id} has data for some beams but not for ${without.join(', ')}`,
        expected: `a ${id} factor table for every beam that can carry the wedge`,
        found: 'none',
      });
    }
  }
  return issues;
}

const PERCENT_KINDS = new Set(['pdd', 'electron pdd']);
const FACTOR_KINDS = new Set(['tpr', 'tmr', 'sc', 'sp', 'scp', 'oar', 'wedge', 'swept wedge', 'se']);
/** No water tank scans deeper than this, no field is wider (cm): larger axis values were written in mm. */
const LARGEST_DEPTH_CM = 60;
const LARGEST_SIDE_CM = 60;

/** A whole table whose values or axes sit where another unit would put them: the likely slip, in one issue. */
function unitSlip(t: LoadedTable, kind: string): Issue | undefined {
  const values = t.csv.values.map((v) => v * t.valueScale).filter(Number.isFinite);
  const lo = Math.min(...values);
  const hi = Math.max(...values);
  const at = { severity: 'error' as const, code: 'physical-range' as const, file: t.csv.file, ...t.csv.valuePositions[0]! };
  const label = `${t.beamId} ${t.quantity}`;
  if (PERCENT_KINDS.has(kind) && hi <= 1.2 && lo >= 0)
    return { ...at, message: `${label}: values between ${lo} and ${hi} in a table declared as percent: fractions?`, expected: 'percent (0 to 100)' };
  if (FACTOR_KINDS.has(kind) && lo >= 30 && hi <= 150)
    return { ...at, message: `${label}: values between ${lo} and ${hi} in a table of factors: percent?`, expected: 'factors near 1' };
  for (const axis of [t.lookup.rows, t.lookup.columns]) {
    if (axis?.unit !== 'cm') continue;
    const largest = Math.max(...axis.values);
    const limit = axis.name === 'depth' ? LARGEST_DEPTH_CM : LARGEST_SIDE_CM;
    if (largest > limit)
      return {
        ...at,
        ...(axis === t.lookup.rows ? t.csv.rowPositions.at(-1)! : t.csv.columnPositions!.at(-1)!),
        message: `${label}: ${axis.name} up to ${largest} in a table declared in cm: millimetres?`,
        expected: `${axis.name} within ${limit} cm`,
        found: `${largest} cm`,
      };
  }
  return undefined;
}

function buildUpEndCm(loaded: LoadedMachine, beamId: string): number {
  return loaded.manifest.beams.find((b) => b.id === beamId)?.calibration.dmaxCm ?? 0;
}

function checkRange(t: LoadedTable, range: { min: number; max: number; minInclusive: boolean }, issues: Issue[]): void {
  t.csv.values.forEach((raw, k) => {
    const v = raw * t.valueScale;
    const low = range.minInclusive ? v < range.min : v <= range.min;
    if (low || v > range.max) {
      const pos = t.csv.valuePositions[k]!;
      issues.push({
        severity: 'error',
        code: 'physical-range',
        file: t.csv.file,
        ...pos,
        message: `${t.beamId} ${t.quantity}: value outside the physical range`,
        expected: `${range.minInclusive ? '>=' : '>'} ${range.min} and <= ${range.max}${t.quantity === 'pdd' ? ' %' : ''}`,
        found: `${v}`,
      });
    }
  });
}

function checkNormalizationRow(
  t: LoadedTable | undefined,
  depthCm: number,
  expected: number,
  tolerance: number,
  what: string,
  issues: Issue[],
): void {
  if (!t) return;
  const rows = t.lookup.rows.values;
  const i = rows.findIndex((r) => Math.abs(r - depthCm) < 1e-6);
  if (i < 0) {
    issues.push({
      severity: 'warning',
      code: 'missing-table',
      file: t.csv.file,
      line: t.csv.rowPositions[0]!.line,
      message: `${t.beamId} ${what}: no row at the normalization depth ${depthCm} cm, so ${what} = ${expected} there cannot be checked`,
    });
    return;
  }
  const n = t.lookup.columns ? t.lookup.columns.values.length : 1;
  for (let j = 0; j < n; j++) {
    const v = t.csv.values[i * n + j]! * t.valueScale;
    if (Math.abs(v - expected) > tolerance) {
      issues.push({
        severity: 'error',
        code: 'physical-range',
        file: t.csv.file,
        ...t.csv.valuePositions[i * n + j]!,
        message: `${t.beamId} ${what} is not ${expected} at its normalization depth ${depthCm} cm`,
        expected: `${expected} ± ${tolerance}`,
        found: `${v}`,
      });
    }
  }
}

/** Each column of an electron PDD is normalized at its own dmax: its largest value must be 100 %. */
function checkColumnMaxima(t: LoadedTable, issues: Issue[]): void {
  const n = t.lookup.columns!.values.length;
  const m = t.lookup.rows.values.length;
  for (let j = 0; j < n; j++) {
    let best = 0;
    for (let i = 1; i < m; i++) if (t.csv.values[i * n + j]! > t.csv.values[best * n + j]!) best = i;
    const v = t.csv.values[best * n + j]! * t.valueScale;
    if (Math.abs(v - 100) > 0.5) {
      issues.push({
        severity: 'error',
        code: 'physical-range',
        file: t.csv.file,
        ...t.csv.valuePositions[best * n + j]!,
        message: `${t.beamId} electron PDD: the column's maximum is not 100 % (each column is normalized at its own dmax)`,
        expected: '100 ± 0.5 %',
        found: `${v}`,
      });
    }
  }
}

/** Roughness along every row and column: each value against the line through its neighbours. */
function checkRoughness(t: LoadedTable, issues: Issue[], minRowValue: number): void {
  const rows = t.lookup.rows.values;
  const cols = t.lookup.columns?.values;
  const n = cols ? cols.length : 1;
  const value = (i: number, j: number) => t.csv.values[i * n + j]! * t.valueScale;
  const lines: { xs: number[]; idx: [number, number][] }[] = [];
  for (let j = 0; j < n; j++) {
    const idx: [number, number][] = [];
    for (let i = 0; i < rows.length; i++) if (rows[i]! >= minRowValue - 1e-9) idx.push([i, j]);
    lines.push({ xs: idx.map(([i]) => rows[i]!), idx });
  }
  if (cols)
    for (let i = 0; i < rows.length; i++) if (rows[i]! >= minRowValue - 1e-9) lines.push({ xs: [...cols], idx: [...cols].map((_, j) => [i, j]) });
  for (const { xs, idx } of lines) {
    if (xs.length < 5) continue;
    const v = idx.map(([i, j]) => value(i, j));
    // Each interior value's distance from the straight line through its two neighbours: a smooth
    // curve keeps these small and alike; a single bad value stands out at its own position.
    // Divided by the product of the two spacings, the departure estimates half the curvature
    // whatever the spacing (exact for a parabola), so uneven grids compare fairly.
    const dev: number[] = [];
    const curvature: number[] = [];
    for (let k = 1; k < xs.length - 1; k++) {
      const t = (xs[k]! - xs[k - 1]!) / (xs[k + 1]! - xs[k - 1]!);
      const d = Math.abs(v[k]! - (v[k - 1]! + t * (v[k + 1]! - v[k - 1]!)));
      dev.push(d);
      curvature.push(d / ((xs[k]! - xs[k - 1]!) * (xs[k + 1]! - xs[k]!)));
    }
    const median = [...curvature].sort((a, b) => a - b)[Math.floor(curvature.length / 2)]!;
    curvature.forEach((ck, m) => {
      const k = m + 1;
      const dk = dev[m]!;
      const rough = ck > ROUGHNESS_RATIO * median && dk > ROUGHNESS_FLOOR * Math.abs(v[k]!);
      // A bad value also pulls its neighbours off their lines; report the largest of the run only.
      if (!rough || (m > 0 && dev[m - 1]! > dk) || (m < dev.length - 1 && dev[m + 1]! > dk)) return;
      const [i, j] = idx[k]!;
      const pos = t.csv.valuePositions[i * n + j]!;
      if (issues.some((x) => x.code === 'rough-table' && x.file === t.csv.file && x.line === pos.line && x.column === pos.column)) return;
      issues.push({
        severity: 'warning',
        code: 'rough-table',
        file: t.csv.file,
        ...pos,
        message:
          `${t.beamId} ${t.quantity}: the value breaks the smooth run of its neighbours ` +
          `(curvature ${(ck / Math.max(median, 1e-12)).toFixed(0)}× the median of its line)`,
        found: `${v[k]}`,
      });
    });
  }
}
