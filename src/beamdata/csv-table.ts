import type { Issue, Result } from '../model/index.js';

/** Where a number was in its file, for messages as file:line:column (1-based). */
export interface CellPosition {
  readonly line: number;
  readonly column: number;
}

/**
 * A table as read from CSV. Grid: the first row holds the column axis after a label cell, each
 * later row starts with its row-axis value. Profile: a header row of labels, then `x, value` rows.
 */
export interface CsvTable {
  readonly file: string;
  readonly rows: readonly number[];
  readonly columns?: readonly number[];
  /** Row-major: values[i * columns.length + j]; one value per row for a profile. */
  readonly values: readonly number[];
  readonly rowPositions: readonly CellPosition[];
  readonly columnPositions?: readonly CellPosition[];
  readonly valuePositions: readonly CellPosition[];
}

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Parses commissioning data kept as CSV: `#` starts a comment, blank lines are skipped, cells are
 * separated by commas (or semicolons or tabs, taken from the first row). Decimal commas are not
 * accepted: a cell like `12,5` would be ambiguous.
 */
export function parseCsvTable(text: string, file: string, shape: 'grid' | 'profile'): Result<CsvTable> {
  const issues: Issue[] = [];
  const at = (line: number, column: number, message: string, expected?: string, found?: string): void => {
    issues.push({
      severity: 'error',
      code: 'invalid-table',
      file,
      line,
      column,
      message,
      ...(expected !== undefined ? { expected } : {}),
      ...(found !== undefined ? { found } : {}),
    });
  };
  const lines: { line: number; cells: { text: string; column: number }[] }[] = [];
  let separator: string | undefined;
  text.split(/\r?\n/).forEach((raw, i) => {
    const hash = raw.indexOf('#');
    const content = hash >= 0 ? raw.slice(0, hash) : raw;
    if (content.trim() === '') return;
    separator ??= [',', ';', '\t'].find((s) => content.includes(s)) ?? ',';
    const cells: { text: string; column: number }[] = [];
    let start = 0;
    for (const part of content.split(separator)) {
      const lead = part.length - part.trimStart().length;
      cells.push({ text: part.trim(), column: start + lead + 1 });
      start += part.length + separator.length;
    }
    while (cells.length > 1 && cells[cells.length - 1]!.text === '') cells.pop(); // trailing separators
    lines.push({ line: i + 1, cells });
  });
  if (lines.length < 2) {
    at(1, 1, 'the table has no data rows', 'a header row and at least one data row', `${lines.length} non-comment row(s)`);
    return { ok: false, issues };
  }
  const num = (c: { text: string; column: number }, line: number, what: string): number => {
    if (!NUMBER.test(c.text)) {
      at(line, c.column, `${what} is not a number`, 'a number with a decimal point', JSON.stringify(c.text));
      return Number.NaN;
    }
    return Number(c.text);
  };
  const [header, ...body] = lines;
  const rows: number[] = [];
  const rowPositions: CellPosition[] = [];
  const values: number[] = [];
  const valuePositions: CellPosition[] = [];
  let columns: number[] | undefined;
  let columnPositions: CellPosition[] | undefined;
  if (shape === 'grid') {
    columns = [];
    columnPositions = [];
    for (const c of header!.cells.slice(1)) {
      columns.push(num(c, header!.line, 'column axis value'));
      columnPositions.push({ line: header!.line, column: c.column });
    }
    if (columns.length === 0) at(header!.line, 1, 'the header row has no column axis', 'a label cell then the column axis values');
  }
  const width = shape === 'grid' ? columns!.length + 1 : 2;
  for (const row of body) {
    if (row.cells.length !== width) {
      at(row.line, 1, 'row has the wrong number of cells', `${width} cells`, `${row.cells.length}`);
      continue;
    }
    rows.push(num(row.cells[0]!, row.line, 'row axis value'));
    rowPositions.push({ line: row.line, column: row.cells[0]!.column });
    for (const c of row.cells.slice(1)) {
      values.push(num(c, row.line, 'value'));
      valuePositions.push({ line: row.line, column: c.column });
    }
  }
  if (issues.length) return { ok: false, issues };
  return {
    ok: true,
    value: { file, rows, ...(columns ? { columns, columnPositions: columnPositions! } : {}), values, rowPositions, valuePositions },
  };
}
