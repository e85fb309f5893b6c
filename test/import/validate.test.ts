import { describe, expect, it } from 'vitest';
import { applyMapping } from '../../src-shared/import/mapping';
import type { MappingTemplate } from '../../src-shared/import/mapping-template';
import { formulaErrors, validateRecords } from '../../src-shared/import/validate';
import type { Finding } from '../../src-shared/import/findings';
import { tableOf } from './table-helpers';

const tpl: MappingTemplate = {
  kind: 'tallywise-mapping', version: 1, layout: 'long', seasonWindow: { from: '04-01', to: '07-31' },
  columns: [{ header: 'Site', role: 'site' }, { header: 'Date', role: 'date' }, { header: 'Species', role: 'species' }, { header: 'Count', role: 'count' }, { header: 'Hours', role: 'effort', unit: 'hours' }],
};

function check(rows: (string | number | null | { date: string })[][]): Finding[] {
  const t = tableOf([['Site', 'Date', 'Species', 'Count', 'Hours'], ...rows]);
  const m = applyMapping(t, tpl);
  return [...formulaErrors(t), ...validateRecords(m.records, { file: 'test.xlsx', effortUnit: m.effortUnit, hasDate: true, seasonWindow: tpl.seasonWindow })];
}

const where = (fs: Finding[], code: string) => fs.filter((f) => f.code === code).map((f) => `${f.column}${f.row}`);

describe('validation', () => {
  const d = (date: string) => ({ date });
  it('finds nothing in clean data', () => {
    expect(check([['North', d('2019-05-03'), 'Newt', 3, 1], ['North', d('2019-06-03'), 'Newt', 0, 1], ['South', d('2019-05-04'), 'Newt', 2, 1.5], ['South', d('2019-06-04'), 'Newt', 1, 1]])).toEqual([]);
  });
  it('negative and non-integer counts, at the count cell', () => {
    const f = check([['North', d('2019-05-03'), 'Newt', -2, 1], ['North', d('2019-06-03'), 'Newt', 2.5, 1]]);
    expect(where(f, 'negative-count')).toEqual(['D2']);
    expect(where(f, 'non-integer-count')).toEqual(['D3']);
    expect(f.every((x) => x.fix.length > 10 && x.message.length > 10)).toBe(true);
  });
  it('missing, zero and implausible effort, at the effort cell; not for not-surveyed counts', () => {
    const f = check([['North', d('2019-05-03'), 'Newt', 3, null], ['North', d('2019-05-10'), 'Newt', 2, 0], ['North', d('2019-05-17'), 'Newt', 1, 45], ['North', d('2019-05-24'), 'Newt', 'NS', null]]);
    expect(where(f, 'effort-missing')).toEqual(['E2']);
    expect(where(f, 'effort-zero')).toEqual(['E3']);
    expect(where(f, 'effort-implausible')).toEqual(['E4']);
    expect(f.find((x) => x.code === 'effort-implausible')!.severity).toBe('warning');
  });
  it('duplicate site-date-species records point at the first', () => {
    const f = check([['North', d('2019-05-03'), 'Newt', 3, 1], ['South', d('2019-05-03'), 'Newt', 3, 1], ['north ', d('2019-05-03'), 'Newt', 4, 1]]);
    const dup = f.filter((x) => x.code === 'duplicate-record');
    expect(dup.map((x) => x.row)).toEqual([4]);
    expect(dup[0].message).toContain('row 2');
  });
  it('sites seen once when most have several visits, and variant names with the merge suggested', () => {
    const rows: (string | number | { date: string })[][] = [];
    for (const site of ['Millrace Pool', 'Rushmoor Pond', 'Teasel Field']) for (const day of ['05-03', '05-17', '06-01']) rows.push([site, d(`2019-${day}`), 'Common toad', 1, 1]);
    rows.push(['Milrace Pool', d('2019-06-15'), 'Common toad', 1, 1]);
    rows.push(['Rushmoor Pond', d('2019-06-15'), 'Comon toad', 1, 1]);
    const f = check(rows);
    expect(f.filter((x) => x.code === 'single-visit-site').map((x) => x.message)).toEqual([expect.stringContaining('"Milrace Pool"')]);
    const site = f.find((x) => x.code === 'similar-site-name')!;
    expect(site.fix).toContain('Merge it into "Millrace Pool"');
    expect(site).toMatchObject({ row: 11, column: 'A' });
    expect(f.find((x) => x.code === 'similar-species-name')!.fix).toContain('"Common toad"');
  });
  it('dates outside the season window; missing and unreadable dates', () => {
    const f = check([['North', d('2019-03-03'), 'Newt', 3, 1], ['North', d('2019-05-03'), 'Newt', 1, 1], ['North', null, 'Newt', 1, 1], ['North', 'soon', 'Newt', 1, 1]]);
    expect(where(f, 'date-outside-season')).toEqual(['B2']);
    expect(where(f, 'date-missing')).toEqual(['B4']);
    expect(where(f, 'date-unreadable')).toEqual(['B5']);
  });
  it('codes that are not counts and formula errors', () => {
    const t = tableOf([['Site', 'Date', 'Species', 'Count', 'Hours'], ['North', { date: '2019-05-03' }, 'Newt', 'lots', 1]]);
    const m = applyMapping(t, tpl);
    expect(where(validateRecords(m.records, { file: 'x', effortUnit: 'hours' }), 'invalid-count')).toEqual(['D2']);
  });
});

describe('date patterns without a season window', () => {
  it('flags a date far from the other visits and a season with a handful of records', async () => {
    const { datePatternFindings } = await import('../../src-shared/import/date-checks');
    const rows: (string | number | { date: string })[][] = [];
    for (let i = 0; i < 24; i++) rows.push([`Site ${i % 6}`, { date: `2019-05-${String(1 + i).padStart(2, '0')}` }, 'Newt', 1, 1]);
    rows.push(['Site 1', { date: '2019-11-02' }, 'Newt', 1, 1]); // row 26: November in a May survey
    rows.push(['Site 2', { date: '2091-05-12' }, 'Newt', 1, 1]); // row 27: year typed wrongly
    const t = tableOf([['Site', 'Date', 'Species', 'Count', 'Hours'], ...rows]);
    const m = applyMapping(t, { ...tpl, seasonWindow: undefined });
    const f = datePatternFindings(m.records, 'x.xlsx');
    expect(f.filter((x) => x.code === 'date-outside-season').map((x) => x.row)).toEqual([26]);
    expect(f.filter((x) => x.code === 'season-few-records').map((x) => [x.row, x.column])).toEqual([[27, 'B']]);
  });
});
