import type { ModelSpec } from '../model/spec';
import { findColumn, selectRows, type DataTable } from './table';

/**
 * The rows a fit is given (the Models stage's fits and the report's runs):
 * those of the chosen species and, when the analyst asked for it, only those
 * whose offsets can be logged (the others are left out and counted, never
 * silently).
 */
export function rowsOfSpecies(table: DataTable, species: readonly string[]): DataTable {
  const col = findColumn(table, 'species');
  if (!col) return selectRows(table, []);
  const wanted = new Set(species);
  const rows: number[] = [];
  col.texts.forEach((t, i) => {
    if (wanted.has(t)) rows.push(i);
  });
  return selectRows(table, rows);
}

/** Rows whose chosen offsets are all usable (positive where logged). */
export function rowsWithOffsets(table: DataTable, spec: ModelSpec): number[] {
  const cols = spec.offsets.map((o) => ({ values: findColumn(table, o.column)?.values, log: o.log }));
  const rows: number[] = [];
  for (let i = 0; i < table.nrows; i++) {
    if (cols.every((c) => c.values !== undefined && (c.log ? c.values[i] > 0 : Number.isFinite(c.values[i])))) rows.push(i);
  }
  return rows;
}

export function fitTableFor(table: DataTable, spec: ModelSpec, species: readonly string[], dropBadOffsetRows: boolean): { table: DataTable; leftOut: number } {
  const chosen = rowsOfSpecies(table, species);
  if (!dropBadOffsetRows || !spec.offsets.length) return { table: chosen, leftOut: 0 };
  const keep = rowsWithOffsets(chosen, spec);
  return { table: selectRows(chosen, keep), leftOut: chosen.nrows - keep.length };
}
