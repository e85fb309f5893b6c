/**
 * The plain column table every stage hands on: the cleaned analysis table,
 * a CSV given to the command line, a subset for one species.
 *
 * Each column keeps the cell texts as they were read (factor levels are those
 * texts) and, beside them, the numbers they parse to (NaN where a cell is
 * blank or not a number). `numeric` says whether every non-blank cell parsed.
 */
export interface TableColumn {
  readonly name: string;
  /** Trimmed cell text; '' for a blank cell. */
  readonly texts: readonly string[];
  /** Parsed numbers, NaN where blank or not numeric. */
  readonly values: Float64Array;
  /** True when every non-blank cell is a number. */
  readonly numeric: boolean;
}

export interface DataTable {
  readonly nrows: number;
  readonly columns: readonly TableColumn[];
}

/** Parses a cell text as a number: '.' or the given decimal mark; no thousands separators. */
export function parseNumber(text: string, decimalMark: '.' | ',' = '.'): number {
  const t = text.trim();
  if (t === '') return Number.NaN;
  const normal = decimalMark === ',' ? t.replace(',', '.') : t;
  if (!/^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/.test(normal)) return Number.NaN;
  return Number(normal);
}

/** Builds a column from its cell texts. */
export function columnFromTexts(name: string, texts: readonly string[], decimalMark: '.' | ',' = '.'): TableColumn {
  const trimmed = texts.map((t) => t.trim());
  const values = new Float64Array(trimmed.length);
  let numeric = true;
  for (let i = 0; i < trimmed.length; i++) {
    const v = parseNumber(trimmed[i], decimalMark);
    values[i] = v;
    if (trimmed[i] !== '' && Number.isNaN(v)) numeric = false;
  }
  return { name, texts: trimmed, values, numeric };
}

/** Builds a numeric column from numbers (NaN = missing). */
export function columnFromNumbers(name: string, numbers: ArrayLike<number>): TableColumn {
  const values = Float64Array.from(numbers);
  const texts = Array.from(values, (v) => (Number.isNaN(v) ? '' : String(v)));
  return { name, texts, values, numeric: true };
}

/** Builds a table from named columns of texts; every column must have the same length. */
export function tableFromTexts(header: readonly string[], rows: readonly (readonly string[])[], decimalMark: '.' | ',' = '.'): DataTable {
  const columns = header.map((name, j) => columnFromTexts(name, rows.map((r) => r[j] ?? ''), decimalMark));
  return { nrows: rows.length, columns };
}

export function findColumn(table: DataTable, name: string): TableColumn | undefined {
  return table.columns.find((c) => c.name === name);
}

/** The column named, or an error that lists the columns there are. */
export function requireColumn(table: DataTable, name: string): TableColumn {
  const col = findColumn(table, name);
  if (!col) {
    const names = table.columns.map((c) => `"${c.name}"`).join(', ');
    throw new TableError('missing-column', `There is no column "${name}". The columns are: ${names}. Check the spelling in the model spec.`);
  }
  return col;
}

/** Keeps the rows whose index is listed, in that order. */
export function selectRows(table: DataTable, rows: readonly number[]): DataTable {
  const columns = table.columns.map((c) => ({
    name: c.name,
    texts: rows.map((i) => c.texts[i]),
    values: Float64Array.from(rows, (i) => c.values[i]),
    numeric: c.numeric,
  }));
  return { nrows: rows.length, columns };
}

/** Splits a table by the text of one column; groups in sorted order of their key. */
export function splitBy(table: DataTable, column: string): { key: string; table: DataTable }[] {
  const col = requireColumn(table, column);
  const groups = new Map<string, number[]>();
  col.texts.forEach((t, i) => {
    const g = groups.get(t);
    if (g) g.push(i);
    else groups.set(t, [i]);
  });
  return sortLevels([...groups.keys()]).map((key) => ({ key, table: selectRows(table, groups.get(key)!) }));
}

/**
 * Sorts factor levels as the command-line contract says: numeric order when
 * every level is a number, otherwise by Unicode code point.
 */
export function sortLevels(levels: readonly string[]): string[] {
  const out = [...levels];
  const allNumbers = out.every((t) => !Number.isNaN(parseNumber(t)));
  if (allNumbers) return out.sort((a, b) => parseNumber(a) - parseNumber(b));
  return out.sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
}

/** Sorted distinct non-blank levels of a column. */
export function levelsOf(col: TableColumn): string[] {
  return sortLevels([...new Set(col.texts.filter((t) => t !== ''))]);
}

export class TableError extends Error {
  constructor(readonly code: string, message: string) {
    super(message);
    this.name = 'TableError';
  }
}
