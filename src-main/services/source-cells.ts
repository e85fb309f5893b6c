import { CellKind, type CellKindCode, type GridColumn, type SheetGrid as ReadGrid } from '@shared/import/cells';
import { isoToSerial1900 } from '@shared/import/excel-dates';
import { cellTypeLetters, type SheetGrid as StoredGrid } from '@shared/project/sheet-grid';

/**
 * The cells of an imported sheet as the project file keeps them (row-major
 * texts and type letters) and back, so an import can be redone from the
 * project alone. Merged ranges are not kept by the stored form.
 */
const letterOfKind: Record<number, string> = {
  [CellKind.blank]: cellTypeLetters.blank,
  [CellKind.number]: cellTypeLetters.number,
  [CellKind.text]: cellTypeLetters.text,
  [CellKind.bool]: cellTypeLetters.boolean,
  [CellKind.error]: cellTypeLetters.error,
  [CellKind.date]: cellTypeLetters.date,
};
const kindOfLetter: Record<string, CellKindCode> = Object.fromEntries(Object.entries(letterOfKind).map(([k, l]) => [l, Number(k) as CellKindCode]));

export function storeGrid(grid: ReadGrid): StoredGrid {
  const texts: string[] = new Array(grid.nrows * grid.ncols);
  const types: string[] = new Array(grid.nrows * grid.ncols);
  for (let r = 0; r < grid.nrows; r++) {
    for (let c = 0; c < grid.ncols; c++) {
      const col = grid.columns[c];
      const k = r * grid.ncols + c;
      texts[k] = col.texts[r] ?? '';
      types[k] = letterOfKind[col.kinds[r]] ?? cellTypeLetters.blank;
    }
  }
  return { name: grid.sheet, rows: grid.nrows, columns: grid.ncols, texts, types: types.join('') };
}

function numberOf(kind: CellKindCode, text: string): number {
  if (kind === CellKind.number) return Number(text);
  if (kind === CellKind.bool) return /^true$/i.test(text) || text === '1' ? 1 : 0;
  if (kind === CellKind.date) return isoToSerial1900(text.slice(0, 10));
  return Number.NaN;
}

export function readStoredGrid(grid: StoredGrid, file: string): ReadGrid {
  const columns: GridColumn[] = [];
  for (let c = 0; c < grid.columns; c++) {
    const texts: string[] = new Array(grid.rows);
    const kinds = new Uint8Array(grid.rows);
    const numbers = new Float64Array(grid.rows);
    for (let r = 0; r < grid.rows; r++) {
      const k = r * grid.columns + c;
      const kind = kindOfLetter[grid.types[k]] ?? CellKind.blank;
      texts[r] = grid.texts[k];
      kinds[r] = kind;
      numbers[r] = numberOf(kind, grid.texts[k]);
    }
    columns.push({ texts, kinds, numbers });
  }
  return { file, sheet: grid.name, hidden: false, nrows: grid.rows, ncols: grid.columns, columns, merges: [] };
}
