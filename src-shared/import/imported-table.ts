import type { Finding } from './findings';

/**
 * The data part of one sheet (or of several stacked sheets) after the
 * header row has been found: one column per header, one entry per data row,
 * each data row remembering its sheet and spreadsheet row number.
 */
export interface ImportedColumn {
  /** Header text (merged header cells filled across; duplicates numbered). */
  readonly name: string;
  /** Column letter in each sheet of the stack (index = sheet index); '' where that sheet lacks the column. */
  readonly letters: readonly string[];
  readonly texts: string[];
  readonly kinds: Uint8Array;
  readonly numbers: Float64Array;
}

export interface ImportQuestion {
  readonly code: 'ambiguous-date-order';
  readonly sheet: string;
  readonly column: string;
  readonly columnName: string;
  /** Texts that read differently day-first and month-first. */
  readonly examples: readonly string[];
  readonly options: readonly ['dmy', 'mdy'];
  readonly message: string;
}

export interface SourceInfo {
  readonly kind: 'xlsx' | 'csv';
  /** CSV: the encoding assumed (utf-8, utf-8 with BOM, utf-16le, utf-16be, windows-1252). */
  readonly encoding?: string;
  readonly delimiter?: string;
  readonly decimalMark?: '.' | ',';
  readonly date1904?: boolean;
}

export interface ImportedTable {
  readonly file: string;
  /** Sheet names in stack order (one for a CSV: its file name). */
  readonly sheets: readonly string[];
  /** Header row number in each sheet. */
  readonly headerRows: readonly number[];
  readonly columns: readonly ImportedColumn[];
  readonly nrows: number;
  /** Spreadsheet row number of each data row. */
  readonly rowNumbers: Int32Array;
  /** Index into `sheets` of each data row. */
  readonly sheetIndex: Uint16Array;
  /** Title rows and notes above the header, trailer notes below: their text and place. */
  readonly notes: readonly { sheet: string; row: number; text: string; where: 'above' | 'below' }[];
  /** What the reader noticed about the layout (blank rows, trailer notes, hidden sheets, filled headers). */
  readonly findings: readonly Finding[];
  readonly questions: readonly ImportQuestion[];
  readonly source: SourceInfo;
}

/** Sheet, row and column letter of one cell of the table. */
export function placeOf(table: ImportedTable, column: number, row: number): { sheet: string; row: number; column: string } {
  const s = table.sheetIndex[row];
  return { sheet: table.sheets[s], row: table.rowNumbers[row], column: table.columns[column]?.letters[s] ?? '' };
}

/** Index of the column with this header name, -1 when there is none. */
export function findImportedColumn(table: ImportedTable, name: string): number {
  return table.columns.findIndex((c) => c.name === name);
}
