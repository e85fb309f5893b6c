import { findColumn, type DataTable } from '../data/table';
import { hasZeroPart, type ModelSpec, type Term } from './spec';
import type { SpeciesRows } from './spec-checks';
import type { TableRoles } from './table-roles';

/**
 * What blank predictor cells cost a fit, said before it runs. The engine's
 * model frame (engine/frame.ts) leaves out every row with a blank cell in a
 * column the model uses; that is not a fault (a visit without a water
 * temperature is common), so these are notes, not problems that stop the
 * fit: per species, each predictor column with blanks, how many rows it
 * takes out and which, and the rows left out in all when several columns
 * have blanks.
 */
function termColumns(terms: readonly Term[]): string[] {
  return terms.flatMap((t) => (t.type === 'interaction' ? [...t.columns] : [t.column]));
}

/** The cell is blank as the model frame reads it: no text and no number. */
function blankRows(table: DataTable, column: string): number[] {
  const col = findColumn(table, column);
  if (!col) return [];
  const rows: number[] = [];
  for (let i = 0; i < table.nrows; i++) if (col.texts[i] === '' && Number.isNaN(col.values[i])) rows.push(i);
  return rows;
}

function placeOf(table: DataTable, row: number, roles: TableRoles): string {
  const site = findColumn(table, roles.site)?.texts[row] || 'no site';
  const season = findColumn(table, roles.season)?.texts[row] || 'no season';
  return `${site}, ${season}`;
}

function rowWord(n: number): string {
  return `${n} row${n === 1 ? '' : 's'}`;
}

export function blankPredictorNotes(spec: ModelSpec, species: readonly SpeciesRows[], roles: TableRoles): string[] {
  const columns = [...new Set([...termColumns(spec.predictors), ...(hasZeroPart(spec.distribution) ? termColumns(spec.zeroPredictors) : [])])];
  const out: string[] = [];
  for (const s of species) {
    const n = s.table.nrows;
    if (n === 0) continue;
    const all = new Set<number>();
    let withBlanks = 0;
    for (const column of columns) {
      const rows = blankRows(s.table, column);
      if (!rows.length) continue;
      withBlanks++;
      rows.forEach((r) => all.add(r));
      const shown = rows.slice(0, 3).map((r) => placeOf(s.table, r, roles)).join('; ');
      const more = rows.length > 3 ? ` and ${rows.length - 3} more` : '';
      out.push(
        `"${column}" is blank in ${rows.length} of the ${n} ${s.species} rows (${shown}${more}), so the fit leaves ${rows.length === 1 ? 'that row' : `those ${rows.length} rows`} out. ` +
          `Fill in the visits' values in Records to keep ${rows.length === 1 ? 'it' : 'them'}, or leave "${column}" out of the model.`,
      );
    }
    if (withBlanks > 1) out.push(`In all, ${rowWord(all.size)} of the ${n} ${s.species} rows are left out for a blank predictor; the fit uses ${rowWord(n - all.size)}.`);
  }
  return out;
}
