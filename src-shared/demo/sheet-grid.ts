/**
 * A workbook as plain data, before it is written: sheets of cells, each cell
 * a number, a text, a calendar date or blank. The Node writer turns this into
 * an .xlsx file; tests and the mess planter work on it directly.
 */
export interface DateCell {
  /** ISO date 'YYYY-MM-DD', written as a real Excel date. */
  readonly date: string;
}
export type SheetCell = number | string | DateCell | null;

export interface SheetGrid {
  readonly name: string;
  /** rows[r][c] is Excel row r+1, column c+1. */
  readonly rows: readonly (readonly SheetCell[])[];
  /** The 1-based row that holds the column headers (bold, frozen below). */
  readonly headerRow: number;
  /** Column widths in characters, by column. */
  readonly widths: readonly number[];
}

export interface WorkbookGrid {
  readonly fileName: string;
  readonly season: number;
  readonly sheets: readonly SheetGrid[];
}

export function isDateCell(cell: SheetCell): cell is DateCell {
  return typeof cell === 'object' && cell !== null;
}

/** 'A' for 1, 'Z' for 26, 'AA' for 27. */
export function columnLetter(column: number): string {
  let n = column;
  let out = '';
  while (n > 0) {
    const r = (n - 1) % 26;
    out = String.fromCharCode(65 + r) + out;
    n = Math.floor((n - 1) / 26);
  }
  return out;
}

/** The cell as text, as a person would read it off the sheet ('' for blank). */
export function cellText(cell: SheetCell): string {
  if (cell === null) return '';
  if (isDateCell(cell)) return cell.date;
  return String(cell);
}
