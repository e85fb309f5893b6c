import { CellKind } from './cells';
import { cellNumber } from './cell-number';
import type { ImportedColumn } from './imported-table';

/**
 * Visit covariates: further columns of the counts sheet recorded on each
 * visit (water temperature, wind, cloud cover, the observer's experience),
 * as opposed to site covariates, which the site list gives once per site.
 *
 * A record keeps each one as a field of its own, named `cov:<header>` so
 * that it can never clash with the record's fixed fields (site, count ...).
 * A column whose every filled cell reads as a number (a number cell, or a
 * text such as "12,5" read with the sheet's decimal mark, as effort is) is
 * held as numbers; any other column as its texts. A blank cell is null.
 */
export type CovariateValue = number | string | null;

const prefix = 'cov:';

/** The record field of a visit covariate. */
export function covariateField(name: string): string {
  return `${prefix}${name}`;
}

/** The covariate a record field holds, or null for a fixed field. */
export function covariateOfField(field: string): string | null {
  return field.startsWith(prefix) ? field.slice(prefix.length) : null;
}

/** One covariate column's values, row by row: numbers when every filled cell is one, else the trimmed texts. */
export function readCovariateColumn(col: ImportedColumn, decimalMark: '.' | ','): CovariateValue[] {
  const n = col.texts.length;
  const numbers = new Array<number>(n);
  let numeric = true;
  for (let i = 0; i < n; i++) {
    if (col.kinds[i] === CellKind.blank || col.texts[i].trim() === '') {
      numbers[i] = Number.NaN;
      continue;
    }
    numbers[i] = cellNumber(col, i, decimalMark);
    if (!Number.isFinite(numbers[i])) numeric = false;
  }
  return col.texts.map((t, i) => {
    const text = t.trim();
    if (text === '' || col.kinds[i] === CellKind.blank) return null;
    return numeric ? numbers[i] : text;
  });
}
