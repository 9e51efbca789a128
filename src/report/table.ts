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

/** A patient point as (x, y, z) mm. */
export function pointMm(p: readonly number[]): string {
  return `(${p.map((v) => v.toFixed(1)).join(', ')}) mm`;
}
