import Papa from 'papaparse';
import { CellKind, GridBuilder, maxColumns, type SheetGrid } from '../../src-shared/import/cells';
import { ImportError } from '../../src-shared/import/import-error';
import { parseNumber } from '../../src-shared/data/table';
import { decodeText, looksLikeText, type EncodingName } from './text-encoding';

/**
 * Reads a .csv/.txt file into a SheetGrid: encoding detected (see
 * text-encoding.ts), the delimiter chosen among comma, semicolon and tab by
 * which splits the first lines most evenly, and the decimal mark read from
 * the numbers (or given). Cells keep their text; a cell that parses as a
 * number with that decimal mark is a number cell.
 */
export interface CsvOptions {
  readonly decimalMark?: '.' | ',';
  readonly encoding?: EncodingName;
}

export interface CsvResult {
  readonly grid: SheetGrid;
  readonly encoding: EncodingName;
  readonly delimiter: ',' | ';' | '\t';
  readonly decimalMark: '.' | ',';
}

const delimiters = [',', ';', '\t'] as const;

/** The delimiter whose field count is most often the same (and above one) over the first lines. */
export function detectDelimiter(text: string): ',' | ';' | '\t' {
  const lines = text.slice(0, 65536).split(/\r\n|\n|\r/).filter((l) => l.trim() !== '').slice(0, 30);
  let best: ',' | ';' | '\t' = ',';
  let bestScore = -1;
  for (const d of delimiters) {
    const counts = lines.map((l) => countOutsideQuotes(l, d));
    const freq = new Map<number, number>();
    for (const c of counts) if (c > 0) freq.set(c, (freq.get(c) ?? 0) + 1);
    let score = 0;
    for (const [c, n] of freq) score = Math.max(score, n * 1000 + c);
    if (score > bestScore) [best, bestScore] = [d, score];
  }
  return best;
}

function countOutsideQuotes(line: string, d: string): number {
  let n = 0;
  let quoted = false;
  for (let i = 0; i < line.length; i++) {
    const ch = line[i];
    if (ch === '"') quoted = !quoted;
    else if (ch === d && !quoted) n++;
  }
  return n;
}

/**
 * The decimal mark: ',' when numbers like 1,5 occur and none like 1.5
 * (with a comma delimiter a comma cannot be a decimal mark).
 */
export function detectDecimalMark(rows: readonly string[][], delimiter: string): '.' | ',' {
  if (delimiter === ',') return '.';
  let comma = 0;
  let dot = 0;
  for (let i = 0; i < rows.length && i < 2000; i++) {
    for (const cell of rows[i]) {
      const t = cell.trim();
      if (/^[+-]?\d+,\d+$/.test(t)) comma++;
      else if (/^[+-]?\d+\.\d+$/.test(t)) dot++;
    }
  }
  return comma > dot ? ',' : '.';
}

export function readCsv(bytes: Uint8Array, file: string, options: CsvOptions = {}): CsvResult {
  if (bytes.length === 0) throw new ImportError('empty-file', `${file} is empty (0 bytes). Choose the saved data file, or export it again.`, { file });
  const { text, encoding } = decodeText(bytes, options.encoding);
  if (!looksLikeText(text)) {
    throw new ImportError('unreadable-file', `${file} does not look like a text (CSV) file: it holds binary data. If it is a workbook, give it the .xlsx extension; otherwise export the data again as CSV.`, { file });
  }
  const delimiter = detectDelimiter(text);
  const parsed = Papa.parse<string[]>(text, { delimiter, skipEmptyLines: false });
  const rows = parsed.data;
  const decimalMark = options.decimalMark ?? detectDecimalMark(rows, delimiter);
  const grid = new GridBuilder();
  for (let r = 0; r < rows.length; r++) {
    const cells = rows[r];
    if (cells.length > maxColumns) {
      throw new ImportError('too-wide', `${file}: row ${r + 1} splits into ${cells.length} fields at "${delimiter === '\t' ? 'tab' : delimiter}", more than a sheet can hold. The file may not be a table, or use another delimiter; check it in a text editor and export it again.`, { file, row: r + 1 });
    }
    for (let c = 0; c < cells.length; c++) {
      const t = cells[c];
      if (t.trim() === '') continue;
      const v = parseNumber(t, decimalMark);
      if (Number.isNaN(v)) grid.set(r + 1, c + 1, CellKind.text, t, Number.NaN);
      else grid.set(r + 1, c + 1, CellKind.number, t, v);
    }
  }
  // A text file has no sheets: its one grid has an empty sheet name, so places read "file, row 4, column C".
  return { grid: grid.finish(file, '', false), encoding, delimiter, decimalMark };
}
