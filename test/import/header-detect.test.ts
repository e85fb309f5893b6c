import { describe, expect, it } from 'vitest';
import { CellKind, GridBuilder } from '../../src-shared/import/cells';
import { detectLayout } from '../../src-shared/import/header-detect';
import { tableOf } from './table-helpers';

/** Layouts as tally sheets are commonly laid out (common practice): titles and notes above the header, blank rows, notes and totals below. */
describe('header detection', () => {
  it('skips titles and notes above the header and blank rows inside the data', () => {
    const t = tableOf([
      ['Spring newt count 2019'],
      ['Counts per pond; NS = not surveyed'],
      [],
      ['Site', 'Date', 'Count', 'Minutes'],
      ['North', { date: '2019-05-03' }, 4, 30],
      [],
      ['South', { date: '2019-05-04' }, 'NS', 25],
      ['East', { date: '2019-05-05' }, 1, 20],
      [],
      ['Entered by the coordinator'],
    ]);
    expect(t.headerRows).toEqual([4]);
    expect(Array.from(t.rowNumbers)).toEqual([5, 7, 8]);
    expect(t.findings.map((f) => [f.code, f.row])).toEqual([['rows-above-header', 1], ['blank-row', 6], ['trailer-note', 10]]);
    expect(t.notes.map((n) => [n.row, n.where, n.text])).toEqual([[1, 'above', 'Spring newt count 2019'], [2, 'above', 'Counts per pond; NS = not surveyed'], [10, 'below', 'Entered by the coordinator']]);
  });
  it('names a blank header cell over data by its letter', () => {
    const t = tableOf([['Site', null, 'Count'], ['North', 'x', 3], ['South', 'y', 4]]);
    expect(t.columns.map((c) => c.name)).toEqual(['Site', 'Column B', 'Count']);
    expect(t.findings.find((f) => f.code === 'blank-header')).toMatchObject({ column: 'B', row: 1 });
  });
  it('keeps a data row whose other cells are blank when it is not at the end', () => {
    const t = tableOf([['Site', 'Date', 'Count'], ['North', '2019-05-03', 2], ['South'], ['East', '2019-05-05', 1]]);
    expect(Array.from(t.rowNumbers)).toEqual([2, 3, 4]);
  });
  it('finds no header in a sheet of numbers', () => {
    const g = new GridBuilder();
    for (let r = 1; r <= 3; r++) for (let c = 1; c <= 3; c++) g.set(r, c, CellKind.number, String(r * c), r * c);
    expect(detectLayout(g.finish('n.xlsx', 'S', false))).toBeNull();
  });
});
