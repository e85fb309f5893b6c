import { parseNumber } from '../data/table';
import { CellKind } from './cells';
import type { ImportedColumn } from './imported-table';

/** A cell's number: a number cell as stored, a text cell read with the sheet's decimal mark, NaN otherwise. */
export function cellNumber(col: ImportedColumn, i: number, decimalMark: '.' | ','): number {
  const k = col.kinds[i];
  if (k === CellKind.number) return col.numbers[i];
  if (k === CellKind.text) return parseNumber(col.texts[i], decimalMark);
  return Number.NaN;
}
