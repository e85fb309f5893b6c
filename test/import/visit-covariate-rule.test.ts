import { describe, expect, it } from 'vitest';
import { aggregateRecords } from '../../src-shared/import/aggregate';
import { combineVisits, covariateKind } from '../../src-shared/import/visit-covariate-rule';
import type { CountRecord } from '../../src-shared/import/records';
import type { CovariateValue } from '../../src-shared/import/visit-covariates';
import { findColumn } from '../../src-shared/data/table';

// The rule that turns a visit covariate into one value per analysis row
// (the project's own rule, stated in visit-covariate-rule.ts). Invented
// values; each expectation is worked out by hand beside it.

function visit(count: number, temp: CovariateValue, sky: CovariateValue): CountRecord {
  return {
    sheet: 'S', row: 1, column: 'C', site: 'A', date: null, dateText: '', season: '2019', visit: '', species: 'Newt', code: String(count), status: 'counted',
    count, rule: '', effort: 1, effortText: '1', area: null, observer: '', covariates: {}, visitCovariates: { temp, sky }, columns: {}, formulaError: false,
  };
}

const visits = [visit(2, 10, 'clear'), visit(7, 14, 'clear'), visit(3, null, 'overcast')];
const asked = [{ name: 'temp', column: 'temp' }, { name: 'sky', column: 'sky' }];

describe('combining a visit covariate over a row\'s visits', () => {
  it('takes the mean of the numbers that are there, and a text only when the visits agree', () => {
    // (10 + 14) / 2 = 12: the blank third visit is not counted as 0.
    expect(combineVisits([10, 14, null], 'number')).toEqual({ value: 12, disagree: false });
    expect(combineVisits([null, null], 'number')).toEqual({ value: null, disagree: false });
    expect(combineVisits(['clear', null, 'clear'], 'text')).toEqual({ value: 'clear', disagree: false });
    expect(combineVisits(['clear', 'overcast'], 'text')).toEqual({ value: null, disagree: true });
  });

  it('calls a covariate numbers only when every value is a number', () => {
    expect(covariateKind([1, null, 2.5])).toBe('number');
    expect(covariateKind([1, 'n/a'])).toBe('text');
  });

  it('sum rule: the mean over the row\'s visits; max rule: the value of the visit that gave the count', () => {
    const sum = aggregateRecords(visits, { rule: 'sum', visitCovariates: asked });
    expect(findColumn(sum.table, 'temp')!.values[0]).toBe(12);
    expect(findColumn(sum.table, 'sky')!.texts[0]).toBe('');
    expect(sum.visitCovariates).toEqual([
      { name: 'temp', column: 'temp', kind: 'number', disagreeing: 0 },
      { name: 'sky', column: 'sky', kind: 'text', disagreeing: 1 },
    ]);
    // The largest count is 7, on the second visit: temp 14, sky clear.
    const max = aggregateRecords(visits, { rule: 'max', visitCovariates: asked });
    expect(findColumn(max.table, 'temp')!.values[0]).toBe(14);
    expect(findColumn(max.table, 'sky')!.texts[0]).toBe('clear');
  });

  it('leaves the table as it was when no visit covariate is asked for', () => {
    const a = aggregateRecords(visits, { rule: 'sum' });
    expect(a.visitCovariates).toEqual([]);
    expect(findColumn(a.table, 'temp')).toBeUndefined();
  });
});
