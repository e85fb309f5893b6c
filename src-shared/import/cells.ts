/**
 * Cells of one sheet as they were read: kept column by column (texts, kinds
 * and numbers side by side) so that a 200k-row sheet costs a few arrays, not
 * a million small objects. Row i of a column is spreadsheet row i + 1.
 */

export const CellKind = { blank: 0, number: 1, text: 2, bool: 3, error: 4, date: 5 } as const;
export type CellKindCode = (typeof CellKind)[keyof typeof CellKind];
export const cellKindNames = ['blank', 'number', 'text', 'bool', 'error', 'date'] as const;
export type CellKindName = (typeof cellKindNames)[number];

export interface GridColumn {
  /** The text of each cell: shared string, inline string, the stored number text, the error text (#N/A), or the ISO date of a date cell. */
  readonly texts: string[];
  readonly kinds: Uint8Array;
  /** Numbers for number, bool (0/1) and date (serial) cells; NaN otherwise. */
  readonly numbers: Float64Array;
}

/** A merged range, 1-based rows and columns, inclusive. */
export interface MergeRange {
  readonly top: number;
  readonly left: number;
  readonly bottom: number;
  readonly right: number;
}

export interface SheetGrid {
  readonly file: string;
  readonly sheet: string;
  readonly hidden: boolean;
  readonly nrows: number;
  readonly ncols: number;
  readonly columns: readonly GridColumn[];
  readonly merges: readonly MergeRange[];
}

export interface CellView {
  readonly text: string;
  readonly kind: CellKindName;
  readonly number: number;
}

/** One cell (row and column 1-based); outside the grid it is blank. */
export function cellAt(grid: SheetGrid, row: number, col: number): CellView {
  const c = grid.columns[col - 1];
  if (!c || row < 1 || row > grid.nrows) return { text: '', kind: 'blank', number: Number.NaN };
  return { text: c.texts[row - 1], kind: cellKindNames[c.kinds[row - 1]], number: c.numbers[row - 1] };
}

/** 1 -> A, 27 -> AA. */
export function columnLetter(col: number): string {
  let n = col;
  let s = '';
  while (n > 0) {
    const m = (n - 1) % 26;
    s = String.fromCharCode(65 + m) + s;
    n = Math.floor((n - 1) / 26);
  }
  return s;
}

/** A -> 1, AA -> 27; 0 when the text holds no letters. */
export function columnNumber(letters: string): number {
  let n = 0;
  for (let i = 0; i < letters.length; i++) {
    const code = letters.charCodeAt(i) & ~32; // upper case
    if (code < 65 || code > 90) break;
    n = n * 26 + (code - 64);
  }
  return n;
}

/**
 * Collects cells in any order (usually row by row) and hands on a SheetGrid.
 * Kinds and numbers grow as typed arrays (doubling), texts as plain arrays.
 */
/** The widest sheet a spreadsheet can hold (column XFD). */
export const maxColumns = 16_384;

class GrowingColumn {
  texts: string[] = [];
  kinds = new Uint8Array(64);
  numbers = new Float64Array(64).fill(Number.NaN);

  ensure(n: number): void {
    if (n <= this.kinds.length) return;
    let cap = this.kinds.length;
    while (cap < n) cap *= 2;
    const kinds = new Uint8Array(cap);
    kinds.set(this.kinds);
    const numbers = new Float64Array(cap).fill(Number.NaN);
    numbers.set(this.numbers);
    this.kinds = kinds;
    this.numbers = numbers;
  }
}

export class GridBuilder {
  private readonly cols: GrowingColumn[] = [];
  private maxRow = 0;
  readonly merges: MergeRange[] = [];

  set(row: number, col: number, kind: CellKindCode, text: string, number: number): void {
    if (col > maxColumns) throw new RangeError(`a cell lies beyond the last spreadsheet column (column ${col})`);
    while (this.cols.length < col) this.cols.push(new GrowingColumn());
    const c = this.cols[col - 1];
    c.ensure(row);
    const t = c.texts;
    while (t.length < row - 1) t.push('');
    if (t.length === row - 1) t.push(text);
    else t[row - 1] = text;
    c.kinds[row - 1] = kind;
    c.numbers[row - 1] = number;
    if (row > this.maxRow) this.maxRow = row;
  }

  finish(file: string, sheet: string, hidden: boolean): SheetGrid {
    const nrows = this.maxRow;
    const columns: GridColumn[] = this.cols.map((c) => {
      c.ensure(nrows);
      const t = c.texts;
      while (t.length < nrows) t.push('');
      return { texts: t, kinds: c.kinds.subarray(0, nrows), numbers: c.numbers.subarray(0, nrows) };
    });
    return { file, sheet, hidden, nrows, ncols: columns.length, columns, merges: this.merges };
  }
}
