import { describe, expect, it } from 'vitest';
import type { ColumnRoles } from '../../src-shared/host/contract';
import { applyMapping } from '../../src-shared/import/mapping';
import { guessTemplate } from '../../src-shared/import/mapping-guess';
import { rolesToTemplate, templateToRoles } from '../../src-shared/import/roles-template';
import { fromCanonicalEffort, toCanonicalEffort } from '../../src-shared/import/units';
import { tableOf } from './table-helpers';

describe('column roles as a mapping template', () => {
  const headers = ['Pond', 'Date', 'Visit', 'Minutes', 'Water temp', 'Newt', 'Toad', 'Remarks'];
  const roles: ColumnRoles = { site: 'Pond', date: 'Date', visit: 'Visit', effort: 'Minutes', effortUnit: 'minutes', speciesColumns: ['Newt', 'Toad'] };

  it('maps every named column, ignores the others, and comes back as the same roles', () => {
    const t = rolesToTemplate(roles, headers, 'dmy');
    expect(t.layout).toBe('wide-species');
    expect(t.dateOrder).toBe('dmy');
    expect(t.columns.map((c) => c.role)).toEqual(['site', 'date', 'visit', 'effort', 'ignore', 'count', 'count', 'ignore']);
    expect(t.columns.find((c) => c.role === 'effort')!.unit).toBe('minutes');
    expect(templateToRoles(t)).toEqual({ roles });
  });

  it('reads a sheet with no finding about columns it was not told of', () => {
    const table = tableOf([headers, ['P1', { date: '2019-05-03' }, 1, 45, 12, 3, 'ns', 'windy']]);
    const m = applyMapping(table, rolesToTemplate(roles, headers));
    expect(m.findings).toEqual([]);
    expect(m.records.map((r) => [r.species, r.count, r.status])).toEqual([['Newt', 3, 'counted'], ['Toad', null, 'not-surveyed']]);
    // 45 minutes = 0.75 hours (the canonical time unit, units.ts)
    expect(m.records[0].effort).toBe(0.75);
    expect(m.effortUnit).toBe('hours');
  });

  it('long sheets: a species and a count column', () => {
    const long: ColumnRoles = { site: 'Site', species: 'Species', count: 'Count' };
    const t = rolesToTemplate(long, ['Site', 'Species', 'Count']);
    expect(t.layout).toBe('long');
    expect(templateToRoles(t)).toEqual({ roles: long });
  });

  it('says what a guessed template lacks', () => {
    expect(templateToRoles(guessTemplate(tableOf([['Where', 'When', 'Tally A'], ['North', '2020-05-01', 3]])))).toEqual({ gap: 'no-site' });
    expect(templateToRoles(guessTemplate(tableOf([['Site', 'Notes'], ['North', 'x']])))).toEqual({ gap: 'no-counts' });
  });

  it('gives effort back in the unit it was written in', () => {
    for (const v of [1, 7, 37, 45, 59, 123.5]) expect(fromCanonicalEffort(toCanonicalEffort(v, 'minutes'), 'minutes')).toBe(v);
    expect(fromCanonicalEffort(toCanonicalEffort(850, 'm'), 'm')).toBe(850);
  });
});
