import { describe, expect, it } from 'vitest';
import { applyMapping } from '../../src-shared/import/mapping';
import { guessTemplate } from '../../src-shared/import/mapping-guess';
import { mappingTemplateSchema, parseTemplate, type MappingTemplate } from '../../src-shared/import/mapping-template';
import { ImportError } from '../../src-shared/import/import-error';
import { tableOf } from './table-helpers';

const wide: MappingTemplate = {
  kind: 'tallywise-mapping', version: 1, layout: 'wide-species',
  columns: [
    { header: 'Site', role: 'site' }, { header: 'Date', role: 'date' }, { header: 'Minutes', role: 'effort', unit: 'minutes' },
    { header: 'Newt', role: 'count' }, { header: 'Toad', role: 'count', species: 'Common toad' }, { header: 'Notes', role: 'ignore' },
  ],
};

describe('mapping', () => {
  it('reshapes a wide-by-species sheet to one record per count cell, with places and units', () => {
    const t = tableOf([
      ['Site', 'Date', 'Minutes', 'Newt', 'Toad', 'Notes'],
      ['North', { date: '2019-05-03' }, 90, 3, 'NS', 'windy'],
      ['South', '04/05/2019', 30, '>50', 0, null],
    ], { dateOrder: 'dmy' });
    const m = applyMapping(t, wide, { dateOrder: 'dmy' });
    expect(m.findings).toEqual([]);
    expect(m.effortUnit).toBe('hours');
    expect(m.records.map((r) => [r.site, r.date, r.species, r.status, r.count, r.effort, r.row, r.column])).toEqual([
      ['North', '2019-05-03', 'Newt', 'counted', 3, 1.5, 2, 'D'],
      ['North', '2019-05-03', 'Common toad', 'not-surveyed', null, 1.5, 2, 'E'],
      ['South', '2019-05-04', 'Newt', 'at-least', 50, 0.5, 3, 'D'],
      ['South', '2019-05-04', 'Common toad', 'counted', 0, 0.5, 3, 'E'],
    ]);
    expect(m.records[0].season).toBe('2019');
  });

  it('reshapes a wide-by-visit sheet, the species from the template', () => {
    const t = tableOf([['Site', 'Year', 'Visit 1', 'Visit 2'], ['North', 2019, 2, 'x'], ['South', 2019, null, 5]]);
    const tpl: MappingTemplate = {
      kind: 'tallywise-mapping', version: 1, layout: 'wide-visit', species: 'Smooth newt',
      columns: [{ header: 'Site', role: 'site' }, { header: 'Year', role: 'season' }, { header: 'Visit 1', role: 'count', visit: '1' }, { header: 'Visit 2', role: 'count', visit: '2' }],
    };
    const m = applyMapping(t, tpl);
    expect(m.records.map((r) => [r.site, r.season, r.visit, r.species, r.status, r.count])).toEqual([
      ['North', '2019', '1', 'Smooth newt', 'counted', 2],
      ['North', '2019', '2', 'Smooth newt', 'present', null],
      ['South', '2019', '1', 'Smooth newt', 'not-surveyed', null],
      ['South', '2019', '2', 'Smooth newt', 'counted', 5],
    ]);
  });

  it('joins site area and covariates from a site sheet, converting m2 to ha', () => {
    const counts = tableOf([['Pond', 'Count'], ['North Pond', 3], ['south pond ', 4]]);
    const sites = tableOf([['Pond', 'Area (m²)', 'Habitat'], ['North Pond', 2500, 'reed'], ['South Pond', 400, 'open']], { sheet: 'Ponds' });
    const tpl: MappingTemplate = {
      kind: 'tallywise-mapping', version: 1, layout: 'long', species: 'Toad',
      columns: [{ header: 'Pond', role: 'site' }, { header: 'Count', role: 'count' }],
      sites: { sheet: 'Ponds', columns: [{ header: 'Pond', role: 'site' }, { header: 'Area (m²)', role: 'area' }, { header: 'Habitat', role: 'covariate' }] },
    };
    const m = applyMapping(counts, tpl, { siteTable: sites });
    expect(m.hasArea).toBe(true);
    expect(m.records.map((r) => [r.area, r.covariates.Habitat])).toEqual([[0.25, 'reed'], [0.04, 'open']]);
  });

  it('re-applies a template by header name and reports missing, renamed-looking and new columns', () => {
    const next = tableOf([['Date', 'Site', 'Newts', 'Frog', 'Effort (min)'], [{ date: '2020-05-01' }, 'North', 1, 2, 30]]);
    const m = applyMapping(next, wide);
    const by = (code: string) => m.findings.filter((f) => f.code === code).map((f) => f.columnName).sort();
    expect(by('template-missing-column')).toEqual(['Minutes', 'Notes', 'Toad']);
    expect(by('template-renamed-column')).toEqual(['Newts']);
    expect(by('template-new-column')).toEqual(['Effort (min)', 'Frog']);
    expect(m.findings.find((f) => f.code === 'template-new-column' && f.columnName === 'Frog')!.column).toBe('D');
    // the renamed column is used in its place
    expect(m.records.map((r) => [r.species, r.count])).toEqual([['Newt', 1]]);
  });

  it('asks for the date order instead of guessing, and uses the answer', () => {
    const t = tableOf([['Site', 'Date', 'Count'], ['North', '03/05/2019', 1], ['South', '04/06/2019', 2]]);
    const tpl: MappingTemplate = { kind: 'tallywise-mapping', version: 1, layout: 'long', species: 'Newt', columns: [{ header: 'Site', role: 'site' }, { header: 'Date', role: 'date' }, { header: 'Count', role: 'count' }] };
    const open = applyMapping(t, tpl);
    expect(open.questions.map((q) => q.code)).toEqual(['ambiguous-date-order']);
    expect(open.records.every((r) => r.date === null)).toBe(true);
    expect(applyMapping(t, tpl, { dateOrder: 'mdy' }).records.map((r) => r.date)).toEqual(['2019-03-05', '2019-04-06']);
    expect(applyMapping(t, { ...tpl, dateOrder: 'dmy' }).records.map((r) => r.date)).toEqual(['2019-05-03', '2019-06-04']);
  });

  it('guesses a wide template from headers, leaving numeric covariates out of the species', () => {
    const t = tableOf([['Pond', 'Date', 'Visit', 'Minutes', 'Water temp (°C)', 'Common toad', 'Pool frog', 'Remarks'], ['A', { date: '2019-05-03' }, 1, 30, 11.5, 3, 'x', 'wet'], ['B', { date: '2019-05-04' }, 1, 25, 12.25, 0, 4, null]]);
    const g = guessTemplate(t);
    expect(g.layout).toBe('wide-species');
    expect(g.columns.filter((c) => c.role === 'count').map((c) => c.header)).toEqual(['Common toad', 'Pool frog']);
    expect(g.columns.find((c) => c.header === 'Minutes')).toMatchObject({ role: 'effort', unit: 'minutes' });
    expect(g.columns.find((c) => c.header === 'Water temp (°C)')!.role).toBe('covariate');
    expect(g.columns.find((c) => c.header === 'Remarks')!.role).toBe('ignore');
  });

  it('templates survive JSON and bad ones are refused with the field named', () => {
    expect(parseTemplate(JSON.parse(JSON.stringify(wide)))).toEqual(mappingTemplateSchema.parse(wide));
    const noSite = { ...wide, columns: wide.columns.filter((c) => c.role !== 'site') };
    expect(() => parseTemplate(noSite, 't.json')).toThrow(/no column has the role "site"/);
    try {
      parseTemplate({ ...wide, layout: 'sideways' }, 't.json');
      throw new Error('accepted');
    } catch (e) {
      expect(e).toBeInstanceOf(ImportError);
      expect((e as ImportError).code).toBe('bad-template');
      expect((e as Error).message).toMatch(/layout/);
    }
  });
});
