import { z } from 'zod';

/**
 * The cells of one imported sheet, stored compactly: the rectangle's size,
 * the cell texts in row-major order (row 1 first, '' for a blank cell) and a
 * string with one type letter per cell in the same order.
 *
 * Type letters: `_` blank, `s` text, `n` number, `d` date, `b` true/false,
 * `e` a spreadsheet error value. The text is always the cell as it was shown
 * in the workbook, so the import can be redone from the project alone.
 */
export const cellTypeLetters = {
  blank: '_',
  text: 's',
  number: 'n',
  date: 'd',
  boolean: 'b',
  error: 'e',
} as const;
export type CellType = keyof typeof cellTypeLetters;

const letterToType = new Map<string, CellType>(Object.entries(cellTypeLetters).map(([t, l]) => [l, t as CellType]));

export const sheetGridSchema = z
  .object({
    name: z.string(),
    rows: z.number().int().min(0),
    columns: z.number().int().min(0),
    texts: z.array(z.string()),
    types: z.string().regex(/^[_sndbe]*$/, 'cell types are letters _ s n d b e'),
    /** True when the sheet was hidden in the workbook. */
    hidden: z.boolean().optional(),
    /** Merged ranges, 1-based rows and columns, inclusive. */
    merges: z
      .array(z.object({ top: z.number().int().min(1), left: z.number().int().min(1), bottom: z.number().int().min(1), right: z.number().int().min(1) }))
      .optional(),
  })
  .refine((g) => g.texts.length === g.rows * g.columns, { message: 'texts must hold rows x columns cells', path: ['texts'] })
  .refine((g) => g.types.length === g.rows * g.columns, { message: 'types must hold rows x columns letters', path: ['types'] });

export type SheetGrid = z.infer<typeof sheetGridSchema>;

export interface GridCell {
  text: string;
  type: CellType;
}

/** Packs rows of cells (ragged rows are padded with blanks) into a grid. */
export function gridFromRows(name: string, rows: readonly (readonly GridCell[])[]): SheetGrid {
  const columns = rows.reduce((m, r) => Math.max(m, r.length), 0);
  const texts: string[] = [];
  let types = '';
  for (const row of rows) {
    for (let c = 0; c < columns; c++) {
      const cell = row[c];
      texts.push(cell ? cell.text : '');
      types += cell ? cellTypeLetters[cell.type] : cellTypeLetters.blank;
    }
  }
  return { name, rows: rows.length, columns, texts, types };
}

/** The cell at 0-based row and column; a blank cell outside the rectangle. */
export function cellAt(grid: SheetGrid, row: number, column: number): GridCell {
  if (row < 0 || column < 0 || row >= grid.rows || column >= grid.columns) return { text: '', type: 'blank' };
  const k = row * grid.columns + column;
  return { text: grid.texts[k], type: letterToType.get(grid.types[k]) ?? 'blank' };
}

/** All rows of the grid as arrays of cells. */
export function gridRows(grid: SheetGrid): GridCell[][] {
  return Array.from({ length: grid.rows }, (_, r) => Array.from({ length: grid.columns }, (_, c) => cellAt(grid, r, c)));
}
