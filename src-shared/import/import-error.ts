/**
 * A file that cannot be read as a table. The message names the file (and the
 * sheet, row or column where known) and says what to do; `code` is stable so
 * that the UI and the command line can branch on it.
 */
export type ImportErrorCode =
  | 'empty-file'
  | 'not-a-workbook'
  | 'damaged-workbook'
  | 'unsupported-file'
  | 'no-such-sheet'
  | 'no-sheets'
  | 'no-header'
  | 'no-data'
  | 'too-wide'
  | 'unreadable-file'
  | 'cancelled'
  | 'bad-template'
  | 'date-order-needed';

export interface ImportPlace {
  readonly file?: string;
  readonly sheet?: string;
  readonly row?: number;
  readonly column?: string;
}

export class ImportError extends Error {
  constructor(
    readonly code: ImportErrorCode,
    message: string,
    readonly place: ImportPlace = {},
  ) {
    super(message);
    this.name = 'ImportError';
  }
}

/** "file.xlsx, sheet "Ponds", row 4, column C" — the parts that are known. */
export function describePlace(p: ImportPlace): string {
  const parts: string[] = [];
  if (p.file) parts.push(p.file);
  if (p.sheet) parts.push(`sheet "${p.sheet}"`);
  if (p.row !== undefined) parts.push(`row ${p.row}`);
  if (p.column) parts.push(`column ${p.column}`);
  return parts.join(', ');
}
