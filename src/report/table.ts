import type { BeamCheck } from '../model/index.js';

/** Left-aligned text columns; the widest cell sets each column's width. */
export function textTable(header: readonly string[], rows: readonly (readonly string[])[]): string[] {
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: readonly string[]) =>
    cells
      .map((c, i) => c.padEnd(widths[i]!))
      .join('  ')
      .trimEnd();
  return [line(header), ...rows.map(line)];
}

/** A number with a fixed count of decimals, or an em dash when absent. */
export function fixed(v: number | undefined, decimals: number): string {
  return v === undefined ? '—' : v.toFixed(decimals);
}

/** A signed number (+1.2), or an em dash when absent. */
export function signed(v: number | undefined, decimals = 1): string {
  return v === undefined ? '—' : `${v >= 0 ? '+' : ''}${v.toFixed(decimals)}`;
}

/**
 * A beam's deviation with the decimals its verdict needs: one, or two where one would round onto a
 * level (2.974 % beside an action level of 3 reads "+2.97", never "+3.0" labelled "needs review").
 */
export function deviationText(b: BeamCheck): string {
  const v = b.status === 'checked' ? b.calculation.doseDeviationPercent : undefined;
  if (v === undefined || b.status !== 'checked') return signed(v);
  const near = [b.tolerancePercent, b.actionPercent].some((level) => Math.abs(Math.abs(v) - level) < 0.05);
  return signed(v, near ? 2 : 1);
}

/** A patient point as (x, y, z) mm. */
export function pointMm(p: readonly number[]): string {
  return `(${p.map((v) => v.toFixed(1)).join(', ')}) mm`;
}

/** Words a number keeps on its line. */
const UNIT = /^(%|cm|mm|cGy|Gy|MU|MV|MeV)\b/;

/** A line cut at spaces to at most `width` columns, never between a number and its unit; the continuation lines indented by `indent`. */
export function wrap(line: string, width: number, indent: string): string[] {
  if (line.length <= width) return [line];
  const out: string[] = [];
  let rest = line;
  while (rest.length > width) {
    let cut = rest.lastIndexOf(' ', width);
    while (cut > indent.length && UNIT.test(rest.slice(cut + 1))) cut = rest.lastIndexOf(' ', cut - 1);
    if (cut <= indent.length) break;
    out.push(rest.slice(0, cut));
    rest = indent + rest.slice(cut + 1);
  }
  out.push(rest);
  return out;
}
