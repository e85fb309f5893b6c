import { describe, expect, it } from 'vitest';
import reference from '../reference/import-reference.json';
import { aggregateRecords, type AggregateRule } from '../../src-shared/import/aggregate';
import type { CountRecord } from '../../src-shared/import/records';
import { findColumn } from '../../src-shared/data/table';

function record(p: Partial<CountRecord>): CountRecord {
  return {
    sheet: 'S', row: 1, column: 'C', site: 'A', date: null, dateText: '', season: '2019', visit: '', species: 'Newt', code: '', status: 'counted',
    count: 0, rule: '', effort: null, effortText: '', area: null, observer: '', covariates: {}, columns: {}, formulaError: false, ...p,
  };
}

/** MASS::Insurance (R): District x Group as the analysis unit, the four Age classes as its visits; Claims as counts, Holders as effort. */
const ins = reference.insurance;
const insRecords = ins.rows.Claims.map((c, i) =>
  record({ site: ins.rows.District[i], season: ins.rows.Group[i], species: 'claims', count: c, effort: ins.rows.Holders[i], row: i + 2 }),
);

describe('analysis table', () => {
  for (const rule of ['sum', 'max', 'mean'] as AggregateRule[]) {
    it(`${rule}: counts and effort match R tapply on MASS::Insurance (import-reference.json, tolerance ${ins.tolerance})`, () => {
      const a = aggregateRecords(insRecords, { rule, effortUnit: 'as given' });
      expect(a.table.nrows).toBe(ins.groups.length);
      const site = findColumn(a.table, 'site')!;
      const season = findColumn(a.table, 'season')!;
      const count = findColumn(a.table, 'count')!;
      const effort = findColumn(a.table, 'effort')!;
      ins.groups.forEach((key, g) => {
        const dot = key.indexOf('.');
        const k = site.texts.findIndex((s, i) => s === key.slice(0, dot) && season.texts[i] === key.slice(dot + 1));
        expect(k, key).toBeGreaterThanOrEqual(0);
        expect(Math.abs(count.values[k] - ins[rule].count[g])).toBeLessThanOrEqual(ins.tolerance * Math.max(1, ins[rule].count[g]));
        expect(Math.abs(effort.values[k] - ins[rule].effort[g])).toBeLessThanOrEqual(ins.tolerance * Math.max(1, ins[rule].effort[g]));
        expect(a.sources[k]).toHaveLength(4);
        for (const i of a.sources[k]) expect(`${insRecords[i].site}.${insRecords[i].season}`).toBe(key);
      });
    });
  }

  it('leaves out not-surveyed, invalid and uncounted records, keeps bounds and estimates flagged, and builds log offsets in hours and ha', () => {
    const recs = [
      record({ count: 4, effort: 0.5, area: 0.25 }),
      record({ count: 50, status: 'at-least', effort: 1, area: 0.25 }),
      record({ count: null, status: 'not-surveyed', effort: 1, area: 0.25 }),
      record({ count: null, status: 'present', effort: 1, area: 0.25 }),
      record({ count: null, status: 'invalid', effort: 1, area: 0.25 }),
      record({ site: 'B', count: null, status: 'not-surveyed', effort: 1 }),
      record({ site: 'C', count: 2, status: 'approximate', effort: 0, area: 2, covariates: { habitat: 'reed' } }),
    ];
    const a = aggregateRecords(recs, { rule: 'sum', effortUnit: 'hours', hasArea: true });
    expect(a.table.nrows).toBe(2); // site B has nothing usable
    const col = (n: string) => Array.from(findColumn(a.table, n)!.values);
    expect(findColumn(a.table, 'site')!.texts).toEqual(['A', 'C']);
    expect(col('count')).toEqual([54, 2]);
    expect(col('effort_h')).toEqual([1.5, 0]);
    expect(col('area_ha')).toEqual([0.25, 2]);
    expect(col('log_effort')[0]).toBeCloseTo(Math.log(1.5), 12);
    expect(Number.isNaN(col('log_effort')[1])).toBe(true); // zero effort: no log, left blank
    expect(findColumn(a.table, 'log_effort')!.texts[1]).toBe('');
    expect(col('offset')[0]).toBeCloseTo(Math.log(1.5) + Math.log(0.25), 12);
    expect(col('at_least_records')).toEqual([1, 0]);
    expect(col('approximate_records')).toEqual([0, 1]);
    expect(col('present_uncounted')).toEqual([1, 0]);
    expect(findColumn(a.table, 'habitat')!.texts).toEqual(['', 'reed']);
    expect(a.excluded).toEqual({ notSurveyed: 2, invalid: 1, presentUncounted: 1 });
    expect(a.sources).toEqual([[0, 1], [6]]);
  });
});
