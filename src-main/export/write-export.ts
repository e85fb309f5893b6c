/**
 * Writes the cleaned-data export to one file: a workbook (.xlsx, every
 * table, laid out as the report's workbook: frozen bold header, number
 * formats, column widths) or a CSV file of one table (UTF-8 with a byte order mark, so
 * spreadsheet programs read accents right; the analysis table unless
 * another is named). A file that cannot be written names itself and the fix.
 */
import { writeFile } from 'node:fs/promises';
import { extname } from 'node:path';
import { DEFAULT_CSV_TABLE, sheetOf, type CleanedDataExport, type ExportTableKey } from '@shared/export/export-model';
import { csvText } from '@shared/export/csv-text';
import { tablesWorkbook } from '../report/xlsx';

export type ExportFormat = 'xlsx' | 'csv';

/** The export could not be written; the message names the file and the fix. */
export class ExportWriteError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'ExportWriteError';
  }
}

export interface WrittenExport {
  readonly path: string;
  readonly format: ExportFormat;
  /** The sheets written, by name. */
  readonly sheets: readonly string[];
  /** Data rows written (all sheets of a workbook). */
  readonly rows: number;
}

/** The format a file name asks for, or null for any other ending. */
export function exportFormatOf(path: string): ExportFormat | null {
  const ext = extname(path).toLowerCase();
  return ext === '.xlsx' ? 'xlsx' : ext === '.csv' ? 'csv' : null;
}

export async function writeCleanedExport(doc: CleanedDataExport, path: string, table?: ExportTableKey): Promise<WrittenExport> {
  const format = exportFormatOf(path);
  if (!format) throw new ExportWriteError(`"${path}" does not end in .xlsx or .csv; give the file one of those endings (.xlsx for every table, .csv for one).`);
  const sheets = format === 'xlsx' ? doc.sheets : [sheetOf(doc, table ?? DEFAULT_CSV_TABLE)];
  const bytes = format === 'xlsx' ? await tablesWorkbook(doc.title, doc.createdAt, doc.sheets) : Buffer.from(`\uFEFF${csvText(sheets[0])}`, 'utf8');
  try {
    await writeFile(path, bytes);
  } catch (err) {
    const code = (err as { code?: unknown })?.code;
    throw new ExportWriteError(`Could not write "${path}" (${typeof code === 'string' ? code : (err as Error).message}). Choose a folder you can write to, with free space, and close the file if another program has it open.`);
  }
  return { path, format, sheets: sheets.map((s) => s.name), rows: sheets.reduce((n, s) => n + s.table.rows.length, 0) };
}
