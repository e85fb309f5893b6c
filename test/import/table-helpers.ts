import { CellKind, GridBuilder } from '../../src-shared/import/cells';
import type { ImportedTable } from '../../src-shared/import/imported-table';
import { tableFromGrids, type TableOptions } from '../../src-shared/import/table-from-grids';

/** A small table from rows of values (header first): strings are text cells, numbers number cells, {date} date cells. */
export function tableOf(rows: readonly (readonly (string | number | null | { date: string })[])[], options: TableOptions & { file?: string; sheet?: string } = {}): ImportedTable {
  const g = new GridBuilder();
  rows.forEach((r, i) =>
    r.forEach((v, j) => {
      if (v === null || v === '') return;
      if (typeof v === 'number') g.set(i + 1, j + 1, CellKind.number, String(v), v);
      else if (typeof v === 'string') g.set(i + 1, j + 1, CellKind.text, v, Number.NaN);
      else g.set(i + 1, j + 1, CellKind.date, v.date, Number.NaN);
    }),
  );
  return tableFromGrids([g.finish(options.file ?? 'test.xlsx', options.sheet ?? 'Counts', false)], { kind: 'xlsx' }, options);
}
