import { basename } from 'node:path';
import { columnFromTexts, type DataTable } from '@shared/data/table';
import { ImportError } from '@shared/import/import-error';
import { readGrids } from '../import/import-file';

/**
 * Reads a cleaned analysis table for the command line (`--data FILE`): a CSV
 * (comma or semicolon, '.' or ',' decimal mark, any supported encoding) or a
 * workbook sheet whose first row holds the column names. Data row i of the
 * table is row i + 2 of the sheet or file.
 */
export async function loadDataTable(file: string, opts: { sheet?: string } = {}): Promise<DataTable> {
  const { grids, source } = await readGrids(file, opts.sheet ? { sheet: opts.sheet } : {});
  const grid = grids[0];
  const where = grid.sheet && source.kind === 'xlsx' ? `${basename(file)}, sheet "${grid.sheet}"` : basename(file);
  if (grid.nrows < 2 || grid.ncols === 0) {
    throw new ImportError('no-data', `${where} has no data rows under its first row. The first row must hold the column names and each later row one record.`, { file, sheet: grid.sheet });
  }
  const header = grid.columns.map((c) => c.texts[0]?.trim() ?? '');
  const blankAt = header.findIndex((h) => h === '');
  const lastNamed = header.length - 1 - [...header].reverse().findIndex((h) => h !== '');
  if (blankAt >= 0 && blankAt < lastNamed) {
    throw new ImportError('no-header', `${where}: column ${blankAt + 1} of the first row has no name. Give every column a name in the first row.`, { file, sheet: grid.sheet, row: 1 });
  }
  const names = header.slice(0, lastNamed + 1);
  const seen = new Set<string>();
  for (const n of names) {
    if (seen.has(n)) throw new ImportError('no-header', `${where}: two columns are named "${n}". Give each column its own name.`, { file, sheet: grid.sheet, row: 1 });
    seen.add(n);
  }
  // Data rows: every row after the first, less blank rows at the end, so
  // that data row i is line i + 2 of the file.
  const isBlank = (r: number) => names.every((_n, j) => (grid.columns[j].texts[r] ?? '').trim() === '');
  let last = grid.nrows - 1;
  while (last >= 1 && isBlank(last)) last--;
  const rows: number[] = [];
  for (let r = 1; r <= last; r++) rows.push(r);
  const decimalMark = source.decimalMark ?? '.';
  const columns = names.map((name, j) =>
    columnFromTexts(
      name,
      rows.map((r) => grid.columns[j].texts[r] ?? ''),
      decimalMark,
    ),
  );
  return { nrows: rows.length, columns };
}
