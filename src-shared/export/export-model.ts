/**
 * The cleaned data as export tables: the records after cleaning, the
 * analysis table the models are fitted to, the change log and a sheet about
 * where it all came from. Each table is a plain header + rows of cells
 * (numbers stay numbers, blanks are null), the same table shape the report's
 * workbook uses, so one writer serves both.
 */
import type { Cell, NumberFormat, SheetTable } from '../report/model';

export const exportTableKeys = ['records', 'analysis', 'changes', 'about'] as const;
export type ExportTableKey = (typeof exportTableKeys)[number];

/** What a CSV export holds when no table is named. */
export const DEFAULT_CSV_TABLE: ExportTableKey = 'analysis';

export interface ExportSheet extends SheetTable {
  readonly key: ExportTableKey;
}

export interface CleanedDataExport {
  /** ISO 8601 date-time of the export. */
  readonly createdAt: string;
  readonly title: string;
  /** How many records there are, kept and left out, and the analysis table's rows (for a line saying what was written). */
  readonly counts: { readonly records: number; readonly kept: number; readonly leftOut: number; readonly analysisRows: number };
  /** In sheet order: Records, Analysis table, Changes, About. */
  readonly sheets: readonly ExportSheet[];
}

export interface ColumnDef {
  readonly header: string;
  readonly format?: NumberFormat;
}

/** A cell with nothing that is not finite: NaN and Infinity become blanks, '' becomes a blank. */
export function cellOf(v: string | number | null | undefined): Cell {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number') return Number.isFinite(v) ? v : null;
  return v === '' ? null : v;
}

export function exportSheet(key: ExportTableKey, name: string, caption: string, columns: readonly ColumnDef[], rows: readonly (readonly Cell[])[], notes?: readonly string[]): ExportSheet {
  return { key, name, table: { kind: 'table', id: `export-${key}`, caption, columns, rows, ...(notes?.length ? { notes } : {}) } };
}

export function sheetOf(doc: CleanedDataExport, key: ExportTableKey): ExportSheet {
  const s = doc.sheets.find((x) => x.key === key);
  if (!s) throw new Error(`The export has no "${key}" table.`);
  return s;
}
