import { describe, expect, it } from 'vitest';
import { checkMappedTable } from '../../src-shared/import/check-table';
import { applyMapping } from '../../src-shared/import/mapping';
import type { MappingTemplate } from '../../src-shared/import/mapping-template';
import { validateRecords, validateRecordsLinked } from '../../src-shared/import/validate';
import { tableOf } from './table-helpers';

// Invented tally rows; what each check must find follows from the rule it
// states (validate.ts), not from our output.
const d = (date: string) => ({ date });
const wide: MappingTemplate = {
  kind: 'tallywise-mapping', version: 1, layout: 'wide-species',
  columns: [
    { header: 'Site', role: 'site' }, { header: 'Date', role: 'date' }, { header: 'Minutes', role: 'effort', unit: 'minutes' },
    { header: 'Newt', role: 'count', species: 'Newt' }, { header: 'Toad', role: 'count', species: 'Toad' },
  ],
};
const header = ['Site', 'Date', 'Minutes', 'Newt', 'Toad'];

function linked(rows: (string | number | null | { date: string })[][], template = wide, head = header) {
  const table = tableOf([head, ...rows]);
  const mapped = applyMapping(table, template);
  return { mapped, found: checkMappedTable(table, template, mapped, 'test.xlsx') };
}
const codeAt = (l: ReturnType<typeof linked>, code: string) => l.found.filter((x) => x.finding.code === code);
const places = (l: ReturnType<typeof linked>, idx: readonly number[]) => idx.map((i) => `${l.mapped.records[i].column}${l.mapped.records[i].row}`);

describe('findings linked to their records', () => {
  it('a count-cell finding names that one record; a visit-cell finding every record of the row', () => {
    const l = linked([['North', d('2019-05-03'), 30, '>5', 2], ['North', d('2019-05-10'), null, 1, 0], ['South', d('2019-05-03'), 30, 1, 1]]);
    const lower = codeAt(l, 'at-least-count');
    expect(lower).toHaveLength(1);
    expect(places(l, lower[0].links.records)).toEqual(['D2']);
    expect(lower[0].links.field).toBe('count');
    const effort = codeAt(l, 'effort-missing');
    expect(effort.map((x) => `${x.finding.column}${x.finding.row}`)).toEqual(['C3']);
    expect(places(l, effort[0].links.records)).toEqual(['D3', 'E3']);
    expect(effort[0].links.field).toBe('effort');
  });

  it('a site-name variant names every record of that spelling and suggests the merge into the commoner one', () => {
    const rows: (string | number | { date: string })[][] = [];
    for (const day of ['05-03', '05-17', '06-01']) rows.push(['Millrace Pool', d(`2019-${day}`), 30, 1, 1], ['Teasel Field', d(`2019-${day}`), 30, 1, 1]);
    rows.push(['Milrace Pool', d('2019-06-15'), 30, 1, 1]);
    const l = linked(rows);
    const v = codeAt(l, 'similar-site-name');
    expect(v).toHaveLength(1);
    expect(v[0].links.merge).toEqual({ field: 'site', from: 'Milrace Pool', into: 'Millrace Pool' });
    expect(places(l, v[0].links.records)).toEqual(['D8', 'E8']);
  });

  it('a repeated row says which row it repeats', () => {
    const l = linked([['North', d('2019-05-03'), 30, 3, 1], ['South', d('2019-05-03'), 30, 1, 1], ['North', d('2019-05-03'), 30, 3, 1]]);
    const dup = codeAt(l, 'duplicate-record');
    expect(dup.map((x) => x.finding.row)).toEqual([4]);
    expect(dup[0].links.repeats).toBe(2);
    expect(dup[0].links.field).toBeUndefined();
    expect(places(l, dup[0].links.records)).toEqual(['D4', 'E4']);
  });

  it('two numbered visits on one day are not a repeat; the same visit twice is', () => {
    const withVisit: MappingTemplate = { ...wide, columns: [...wide.columns, { header: 'Visit', role: 'visit' }] };
    const head = [...header, 'Visit'];
    const l = linked([['North', d('2019-05-03'), 30, 3, 1, 1], ['North', d('2019-05-03'), 30, 2, 0, 2], ['North', d('2019-05-03'), 30, 3, 1, 2]], withVisit, head);
    const dup = codeAt(l, 'duplicate-record');
    expect(dup.map((x) => [x.finding.row, x.links.repeats])).toEqual([[4, 3]]);
    expect(dup[0].finding.message).toContain('2019-05-03, visit 2');
  });

  it('notes a written not-surveyed code (not a blank cell) and a date typed as text among real dates', () => {
    const l = linked([['North', d('2019-05-03'), 30, 'ns', null], ['North', '10/05/2019', 30, 1, 1]], { ...wide, dateOrder: 'dmy' });
    expect(codeAt(l, 'not-surveyed-code').map((x) => `${x.finding.column}${x.finding.row}`)).toEqual(['D2']);
    const text = codeAt(l, 'date-as-text');
    expect(text.map((x) => `${x.finding.column}${x.finding.row}`)).toEqual(['B3']);
    expect(text[0].finding.message).toContain('2019-05-10');
    // In a sheet where every date is text (a CSV) a text date is nothing to remark on.
    const all = linked([['North', '03/05/2019', 30, 1, 1], ['North', '10/05/2019', 30, 1, 1]], { ...wide, dateOrder: 'dmy' });
    expect(codeAt(all, 'date-as-text')).toEqual([]);
  });

  it('reads a plain number in the date column as a day serial (1900 system: 43588 is 2019-05-03)', () => {
    // Serial 43588 = 2019-05-03 in the 1900 date system (the spreadsheet convention; from memory, checked by excel-dates.test.ts).
    const l = linked([['North', 43588, 30, 1, 1]]);
    expect(l.mapped.records[0]).toMatchObject({ date: '2019-05-03', dateKind: 'number' });
    expect(l.found.filter((x) => x.finding.code.startsWith('date-'))).toEqual([]);
  });

  it('does not take the species headers of a wide sheet for misspellings, nor flag one of two sites as visited once', () => {
    const l = linked([['North ridge', d('2020-05-01'), 30, 3, 0], ['South ridge', d('2020-05-01'), 30, 1, 2], ['North ridge', d('2020-06-01'), 30, 4, 1]],
      { ...wide, columns: [...wide.columns.slice(0, 3), { header: 'Tally A', role: 'count', species: 'Tally A' }, { header: 'Tally B', role: 'count', species: 'Tally B' }] },
      ['Site', 'Date', 'Minutes', 'Tally A', 'Tally B']);
    expect(l.found.map((x) => x.finding.code)).toEqual([]);
  });

  it('gives the same findings as the plain record checks', () => {
    const rows = [['North', d('2019-05-03'), 30, -1, 'c5'], ['North', d('2019-05-03'), 0, 2, 'x?'], ['', d('2019-05-04'), 30, 1, 1]];
    const table = tableOf([header, ...rows]);
    const m = applyMapping(table, wide);
    const options = { file: 't.xlsx', effortUnit: m.effortUnit, hasDate: true };
    expect(validateRecordsLinked(m.records, options).map((x) => x.finding)).toEqual(validateRecords(m.records, options));
  });
});
