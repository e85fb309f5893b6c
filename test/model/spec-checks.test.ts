/**
 * The checks a spec passes before it is fitted (src-shared/model/spec-checks.ts),
 * on MASS's epil data (Thall & Vail 1990, as shipped with MASS and stored in
 * test/reference/glm/glm-fixtures.json): seizure counts of 59 patients in 4
 * periods, read here as 59 sites in 4 seasons. Every expected number (rows,
 * sites, distinct values) is counted from those data in the test itself; the
 * "at least 5 sites" rule for a random intercept is common practice.
 */
import { describe, expect, it } from 'vitest';
import { tableFromTexts, type DataTable } from '@shared/data/table';
import { checkSpec, MIN_RANDOM_SITES } from '@shared/model/spec-checks';
import { parseModelSpec, type ModelSpecInput } from '@shared/model/spec';
import type { TableRoles } from '@shared/model/table-roles';
import { fixture } from '../engine/helpers/glm-fixtures';

const epil = fixture('epil-poisson-spline').data;
const periods = fixture('epil-poisson-site-fixed').data;
const n = epil.y.length;
const header = ['count', 'site', 'season', 'trt', 'age', 'lbase', 'seizures_offset'];
const allRows = Array.from({ length: n }, (_, i) => [epil.y[i], epil.subject[i], periods.period[i], epil.trt[i], epil.age[i], epil.lbase[i], epil.y[i]].map(String));
// The seizure counts double as an offset column to exercise the offset check (they hold zeros).
const roles: TableRoles = { response: 'count', site: 'site', season: 'season', species: 'species', effort: { column: 'seizures_offset', unit: 'seizures' } };

function table(keep: (row: string[]) => boolean = () => true): DataTable {
  return tableFromTexts(header, allRows.filter(keep));
}

function check(input: Partial<ModelSpecInput>, t: DataTable = table()): string[] {
  return checkSpec(parseModelSpec({ response: 'count', distribution: 'poisson', ...input }), [{ species: 'epil', table: t }], roles);
}

describe('spec checks on the epil data', () => {
  it('uses the same subject order in both fixtures (so periods line up with the rows)', () => {
    expect(periods.subject).toEqual(epil.subject);
  });

  it('passes a spec that can be fitted', () => {
    expect(check({ predictors: [{ column: 'trt', type: 'factor' }, { column: 'age', type: 'spline', df: 3 }, { type: 'interaction', columns: ['trt', 'lbase'] }], site: { column: 'site', effect: 'random' }, time: { column: 'season', trend: 'annual' } })).toEqual([]);
  });

  it('refuses a random site effect with fewer than 5 sites, naming how many there are', () => {
    const four = [...new Set(epil.subject.map(String))].slice(0, MIN_RANDOM_SITES - 1);
    const problems = check({ site: { column: 'site', effect: 'random' } }, table((r) => four.includes(r[1])));
    expect(problems).toEqual([`A random site effect needs at least 5 sites to estimate the spread between them, but epil has rows from ${four.length} sites; use a fixed site effect or none.`]);
    expect(check({ site: { column: 'site', effect: 'random' } }, table((r) => four.concat(String(epil.subject[n - 1])).includes(r[1])))).toEqual([]);
  });

  it('refuses a predictor with one value in the rows', () => {
    const placebo = table((r) => r[3] === 'placebo');
    expect(check({ predictors: [{ column: 'trt', type: 'factor' }] }, placebo)).toEqual(['The predictor "trt" has only one value ("placebo") in the epil rows, so its effect cannot be estimated; remove it for this species.']);
  });

  it('refuses a predictor that does not change within sites when sites are fixed effects (each patient has one treatment)', () => {
    const spec = { predictors: [{ column: 'trt', type: 'factor' as const }, { column: 'lbase', type: 'numeric' as const }] };
    expect(check({ ...spec, site: { column: 'site', effect: 'fixed' } })).toEqual([
      'The predictor "trt" does not change within any site in the epil rows, so the fixed site effect (one term per site) takes it in and its effect cannot be estimated; choose a random site effect to estimate it, or remove "trt".',
      'The predictor "lbase" does not change within any site in the epil rows, so the fixed site effect (one term per site) takes it in and its effect cannot be estimated; choose a random site effect to estimate it, or remove "lbase".',
    ]);
    expect(check({ ...spec, site: { column: 'site', effect: 'random' } })).toEqual([]);
    // The season changes within each patient, so it stays estimable beside fixed sites.
    expect(check({ predictors: [{ column: 'season', type: 'factor' }], site: { column: 'site', effect: 'fixed' } })).toEqual([]);
  });

  it('refuses an offset with zeros, naming how many rows and the first places', () => {
    const zeros = allRows.filter((r) => r[0] === '0');
    const problems = check({ offsets: [{ column: 'seizures_offset' }] });
    expect(problems).toHaveLength(1);
    expect(problems[0]).toContain(`Effort (seizures) is zero or missing in ${zeros.length} epil rows (${zeros[0][1]}, ${zeros[0][2]}; ${zeros[1][1]}, ${zeros[1][2]}; ${zeros[2][1]}, ${zeros[2][2]} and ${zeros.length - 3} more)`);
    expect(problems[0]).toContain('or untick that offset');
  });

  it('refuses an interaction of a column with itself and a term given twice', () => {
    expect(check({ predictors: [{ column: 'lbase', type: 'numeric' }, { type: 'interaction', columns: ['lbase', 'lbase'] }] })).toEqual([
      'The predictor interaction "lbase × lbase" pairs a column with itself, which adds nothing the column does not; remove it, or pair "lbase" with another column.',
    ]);
    expect(check({ predictors: [{ type: 'interaction', columns: ['trt', 'lbase'] }, { type: 'interaction', columns: ['lbase', 'trt'] }] })).toEqual(['The predictor "lbase × trt" is given more than once; keep one.']);
  });

  it('refuses a smooth curve with as many degrees of freedom as distinct values (seasons named as such)', () => {
    const seasons = new Set(periods.period.map(String)).size;
    const smooth = (df: number) => check({ predictors: [{ column: 'season', type: 'spline', df }], time: { column: 'season', trend: 'linear' } });
    expect(smooth(seasons)).toEqual([`The smooth curve in "season" asks for ${seasons} degrees of freedom, but the epil rows come from only ${seasons} seasons; choose at most ${seasons - 1} degrees of freedom.`]);
    expect(smooth(seasons - 1)).toEqual([]);
    const someSubjects = [...new Set(epil.subject.map(String))].slice(0, 8);
    const some = table((r) => someSubjects.includes(r[1]));
    const ages = new Set(allRows.filter((r) => someSubjects.includes(r[1])).map((r) => r[4])).size;
    expect(check({ predictors: [{ column: 'age', type: 'spline', df: ages }] }, some)).toEqual([`The smooth curve in "age" asks for ${ages} degrees of freedom, but the epil rows have only ${ages} distinct values of it; choose at most ${ages - 1} degrees of freedom.`]);
  });

  it('refuses a smooth curve or a number on a column that holds text', () => {
    const problems = check({ predictors: [{ column: 'trt', type: 'spline', df: 1 }] });
    expect(problems).toHaveLength(1);
    expect(problems[0]).toMatch(new RegExp(`^The predictor "trt" is not a number in ${n} epil rows .*a smooth curve needs numbers`));
  });

  it('checks the zero-part predictors too, and asks for a species first', () => {
    expect(check({ distribution: 'zip', zeroPredictors: [{ column: 'trt', type: 'factor', reference: 'none' }] })).toEqual(['The reference level "none" of "trt" does not occur in the epil rows; choose one of "placebo", "progabide".']);
    expect(checkSpec(parseModelSpec({ response: 'count', distribution: 'poisson' }), [], roles)).toEqual(['Choose at least one species to fit.']);
  });
});
