import { readFile } from 'node:fs/promises';
import type { SheetGrid } from '../../src-shared/import/cells';
import { ImportError } from '../../src-shared/import/import-error';
import type { ImportedTable } from '../../src-shared/import/imported-table';
import { tableFromGrids } from '../../src-shared/import/table-from-grids';
import type { DateOrder } from '../../src-shared/import/text-dates';
import { readCsv } from './csv-reader';
import { stopIfCancelled } from './import-cancelled';
import type { EncodingName } from './text-encoding';
import { openPackage, sheetBytes, type WorkbookInfo } from './xlsx-package';
import { readSheet } from './xlsx-sheet';

/**
 * The import service: a workbook or CSV file in, an ImportedTable out (or a
 * list of sheets). Every failure is an ImportError naming the file.
 */
export interface ImportOptions {
  /** One sheet by name (default: the first visible sheet). */
  readonly sheet?: string;
  /** Several sheets stacked by header name. */
  readonly sheets?: readonly string[];
  readonly dateOrder?: DateOrder;
  readonly decimalMark?: '.' | ',';
  readonly encoding?: EncodingName;
  /** Fraction of the file read (0 to 1), a stage sentence, and where: the sheet (1-based of how many) and the spreadsheet row reached. */
  readonly onProgress?: (fraction: number, stage: string, at?: ReadPlace) => void;
  /** Checked between chunks and sheets; when aborted, the read rejects with ImportCancelled. */
  readonly signal?: AbortSignal;
}

export interface ReadPlace {
  readonly sheet: string;
  readonly sheetIndex: number;
  readonly sheetCount: number;
  readonly rows: number;
}

export interface SheetSummary {
  readonly name: string;
  readonly hidden: boolean;
}

export type FileKind = 'xlsx' | 'csv';

/** By extension; .xlsm/.xltx are the same package. */
export function fileKind(file: string): FileKind {
  const ext = /\.([^.\\/]+)$/.exec(file)?.[1]?.toLowerCase() ?? '';
  if (['xlsx', 'xlsm', 'xltx', 'xltm'].includes(ext)) return 'xlsx';
  if (['csv', 'txt', 'tsv', 'tab'].includes(ext)) return 'csv';
  if (ext === 'xls') {
    throw new ImportError('unsupported-file', `${file} is an old-style .xls workbook, which is not read here. Open it in a spreadsheet program and save it as .xlsx or .csv.`, { file });
  }
  throw new ImportError('unsupported-file', `${file} has an extension that is not read here (.${ext || 'none'}). Give an .xlsx workbook or a .csv/.txt file.`, { file });
}

export async function readBytes(file: string): Promise<Uint8Array> {
  try {
    return await readFile(file);
  } catch (e) {
    const code = (e as NodeJS.ErrnoException).code;
    const why = code === 'ENOENT' ? 'does not exist' : code === 'EISDIR' ? 'is a folder, not a file' : code === 'EACCES' ? 'cannot be opened (no permission)' : `cannot be read (${code ?? 'unknown error'})`;
    throw new ImportError('unreadable-file', `${file} ${why}. Check the path and try again.`, { file });
  }
}

/** The sheets of a workbook (a CSV has one, with an empty name). */
export async function listSheets(file: string): Promise<SheetSummary[]> {
  const bytes = await readBytes(file);
  if (fileKind(file) === 'csv') return [{ name: '', hidden: false }];
  return openPackage(bytes, file).info.sheets.map((s) => ({ name: s.name, hidden: s.hidden }));
}

function pickSheets(info: WorkbookInfo, file: string, options: ImportOptions) {
  const names = options.sheets ?? (options.sheet ? [options.sheet] : undefined);
  if (!names) {
    const first = info.sheets.find((s) => !s.hidden) ?? info.sheets[0];
    return [first];
  }
  return names.map((name) => {
    const entry = info.sheets.find((s) => s.name === name) ?? info.sheets.find((s) => s.name.toLowerCase() === name.trim().toLowerCase());
    if (!entry) {
      throw new ImportError('no-such-sheet', `${file} has no sheet "${name}". Its sheets are: ${info.sheets.map((s) => `"${s.name}"${s.hidden ? ' (hidden)' : ''}`).join(', ')}.`, { file, sheet: name });
    }
    return entry;
  });
}

/** Reads the cells of the chosen sheets of a workbook, without finding a header. */
export async function readWorkbookGrids(bytes: Uint8Array, file: string, options: ImportOptions = {}): Promise<{ grids: SheetGrid[]; info: WorkbookInfo }> {
  const { info } = openPackage(bytes, file);
  const entries = pickSheets(info, file, options);
  const grids: SheetGrid[] = [];
  for (let i = 0; i < entries.length; i++) {
    stopIfCancelled(options.signal, file, { sheet: entries[i].name });
    const data = sheetBytes(bytes, file, entries[i]);
    const at = { sheet: entries[i].name, sheetIndex: i + 1, sheetCount: entries.length };
    const onProgress = options.onProgress && ((f: number, stage: string, rows: number) => options.onProgress!((i + f) / entries.length, stage, { ...at, rows }));
    grids.push(await readSheet(data, file, entries[i], info, { onProgress, signal: options.signal }));
  }
  return { grids, info };
}

/** Reads the grids of a file of either kind. */
export async function readGrids(file: string, options: ImportOptions = {}): Promise<{ grids: SheetGrid[]; source: ImportedTable['source'] }> {
  const kind = fileKind(file);
  const bytes = await readBytes(file);
  stopIfCancelled(options.signal, file);
  if (kind === 'csv') {
    options.onProgress?.(0, 'reading text');
    const csv = readCsv(bytes, file, { decimalMark: options.decimalMark, encoding: options.encoding });
    options.onProgress?.(1, 'reading text');
    return { grids: [csv.grid], source: { kind: 'csv', encoding: csv.encoding, delimiter: csv.delimiter, decimalMark: csv.decimalMark } };
  }
  const { grids, info } = await readWorkbookGrids(bytes, file, options);
  return { grids, source: { kind: 'xlsx', date1904: info.date1904, decimalMark: '.' } };
}

/** A file in, its table out: header found, blank rows and notes set aside, questions asked. */
export async function importFile(file: string, options: ImportOptions = {}): Promise<ImportedTable> {
  const { grids, source } = await readGrids(file, options);
  stopIfCancelled(options.signal, file);
  return tableFromGrids(grids, source, { dateOrder: options.dateOrder });
}
