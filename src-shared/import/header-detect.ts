import { CellKind, type SheetGrid } from './cells';

/**
 * Where the table sits in a sheet: title rows and notes above the header,
 * the header row (or rows, when header cells are merged downwards), the data
 * rows, blank rows inside the data, and trailer notes or total rows below.
 */
export interface SheetLayout {
  /** The first header row (1-based). */
  readonly headerRow: number;
  /** The last header row: the same as headerRow unless header cells are merged down over two rows. */
  readonly headerEnd: number;
  /** Header text of each column (merged cells filled across), '' when the header cell is blank. */
  readonly headerTexts: readonly string[];
  /** Columns whose header was filled from a merged cell. */
  readonly filledFromMerge: readonly number[];
  readonly dataRows: readonly number[];
  readonly blankRows: readonly number[];
  readonly notesAbove: readonly number[];
  readonly trailerRows: readonly number[];
  /** Trailer rows that start with "Total" and so repeat the data. */
  readonly totalRows: readonly number[];
}

const totalRe = /^(grand\s+)?(total|totals|sum|summe|totaal)\b/i;

function rowStats(grid: SheetGrid): { filled: Int32Array; texts: Int32Array } {
  const filled = new Int32Array(grid.nrows + 1);
  const texts = new Int32Array(grid.nrows + 1);
  for (const col of grid.columns) {
    const kinds = col.kinds;
    for (let i = 0; i < grid.nrows; i++) {
      const k = kinds[i];
      if (k === CellKind.blank) continue;
      if (k === CellKind.text && col.texts[i].trim() === '') continue;
      filled[i + 1]++;
      if (k === CellKind.text) texts[i + 1]++;
    }
  }
  return { filled, texts };
}

/** The most common count of filled cells among rows with at least two (the table's width); ties go to the wider. */
function typicalWidth(filled: Int32Array): number {
  const freq = new Map<number, number>();
  for (let r = 1; r < filled.length; r++) if (filled[r] >= 2) freq.set(filled[r], (freq.get(filled[r]) ?? 0) + 1);
  let best = 0;
  let bestN = 0;
  for (const [w, n] of freq) if (n > bestN || (n === bestN && w > best)) [best, bestN] = [w, n];
  return best || 1;
}

function firstText(grid: SheetGrid, row: number): string {
  for (const col of grid.columns) {
    const t = col.texts[row - 1];
    if (col.kinds[row - 1] !== CellKind.blank && t.trim() !== '') return t.trim();
  }
  return '';
}

/** Finds the layout; null when the sheet holds no row that can be a header. */
export function detectLayout(grid: SheetGrid): SheetLayout | null {
  const { filled, texts } = rowStats(grid);
  const width = typicalWidth(filled);
  const need = width === 1 ? 1 : Math.max(2, Math.ceil(width * 0.5));
  let headerRow = 0;
  const scanTo = Math.min(grid.nrows, 200);
  for (let r = 1; r <= scanTo; r++) {
    if (filled[r] >= need && texts[r] >= Math.ceil(filled[r] * 0.8)) {
      headerRow = r;
      break;
    }
  }
  if (headerRow === 0) return null;

  // Header cells merged downwards make a two-row header: names come from the lower row, or from the merged cell above.
  let headerEnd = headerRow;
  for (const m of grid.merges) if (m.top === headerRow && m.bottom > headerEnd && m.bottom <= headerRow + 2) headerEnd = m.bottom;

  const headerTexts: string[] = [];
  const filledFromMerge: number[] = [];
  for (let c = 1; c <= grid.ncols; c++) {
    let text = '';
    for (let r = headerEnd; r >= headerRow && text === ''; r--) text = (grid.columns[c - 1].texts[r - 1] ?? '').trim();
    headerTexts.push(text);
  }
  for (const m of grid.merges) {
    if (m.bottom < headerRow || m.top > headerEnd) continue;
    const source = (grid.columns[m.left - 1]?.texts[m.top - 1] ?? '').trim();
    if (source === '') continue;
    for (let c = m.left; c <= m.right && c <= grid.ncols; c++) {
      if (headerTexts[c - 1] === '') {
        headerTexts[c - 1] = source;
        if (c !== m.left) filledFromMerge.push(c);
      }
    }
  }

  const notesAbove: number[] = [];
  for (let r = 1; r < headerRow; r++) if (filled[r] > 0) notesAbove.push(r);

  // Trailer: from the bottom up, single-cell text rows (when the table is wider than two columns) and total rows.
  const trailerRows: number[] = [];
  const totalRows: number[] = [];
  let lastData = grid.nrows;
  for (let r = grid.nrows; r > headerEnd; r--) {
    if (filled[r] === 0) continue;
    const first = firstText(grid, r);
    if (totalRe.test(first)) {
      trailerRows.push(r);
      totalRows.push(r);
      lastData = r - 1;
      continue;
    }
    if (width >= 3 && filled[r] === 1 && texts[r] === 1) {
      trailerRows.push(r);
      lastData = r - 1;
      continue;
    }
    break;
  }
  trailerRows.reverse();
  totalRows.reverse();

  const dataRows: number[] = [];
  const blankRows: number[] = [];
  for (let r = headerEnd + 1; r <= lastData; r++) {
    if (filled[r] === 0) blankRows.push(r);
    else dataRows.push(r);
  }
  // Blank rows after the last data row are just the end of the sheet.
  const lastFilled = dataRows.length ? dataRows[dataRows.length - 1] : headerEnd;
  const innerBlank = blankRows.filter((r) => r < lastFilled);
  return { headerRow, headerEnd, headerTexts, filledFromMerge, dataRows, blankRows: innerBlank, notesAbove, trailerRows, totalRows };
}
