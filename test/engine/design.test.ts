import { describe, expect, it } from 'vitest';
import { columnFromNumbers, tableFromTexts } from '@shared/data/table';
import { buildDesign } from '@shared/engine/design/build';
import { findAliased } from '@shared/engine/design/aliasing';
import { naturalSplineBasis, splineKnots } from '@shared/engine/design/spline';
import { FitInputError } from '@shared/engine/types';
import { glmFixtures } from './helpers/glm-fixtures';

const table = tableFromTexts(
  ['count', 'habitat', 'temp', 'year', 'grazed'],
  [
    ['3', 'sedge', '10.5', '2012', 'no'],
    ['0', 'reed', '12', '2013', 'yes'],
    ['5', 'open', '9', '2012', 'yes'],
    ['2', 'reed', '11', '2014', 'no'],
    ['7', 'sedge', '8.5', '2013', 'yes'],
    ['1', 'open', '13', '2014', 'no'],
  ],
);

function col(d: { n: number; data: Float64Array; names: readonly string[] }, name: string): number[] {
  const j = d.names.indexOf(name);
  expect(j, `column ${name}`).toBeGreaterThanOrEqual(0);
  return Array.from(d.data.subarray(j * d.n, (j + 1) * d.n));
}

describe('buildDesign: coding and names (shared/cli-contract.md)', () => {
  it('codes a factor against the first level in sorted order by default', () => {
    const { design, levels } = buildDesign(table, [{ column: 'habitat', type: 'factor' }], { intercept: true });
    expect(design.names).toEqual(['intercept', 'habitat=reed', 'habitat=sedge']);
    expect(levels[0]).toMatchObject({ kind: 'factor', reference: 'open', levels: ['open', 'reed', 'sedge'] });
    expect(col(design, 'habitat=sedge')).toEqual([1, 0, 0, 0, 1, 0]);
    expect(design.termOf).toEqual([-1, 0, 0]);
  });

  it('uses the given reference and numeric order for numeric levels', () => {
    const { design } = buildDesign(
      table,
      [
        { column: 'habitat', type: 'factor', reference: 'reed' },
        { column: 'year', type: 'factor' },
      ],
      { intercept: true },
    );
    expect(design.names).toEqual(['intercept', 'habitat=open', 'habitat=sedge', 'year=2013', 'year=2014']);
  });

  it('sorts levels that are all numbers numerically, not as text', () => {
    const t = tableFromTexts(['f'], [['10'], ['9'], ['100'], ['9']]);
    const { design } = buildDesign(t, [{ column: 'f', type: 'factor' }], { intercept: true });
    expect(design.names).toEqual(['intercept', 'f=10', 'f=100']);
  });

  it('builds numeric x factor and factor x factor interactions, first part varying fastest', () => {
    const { design } = buildDesign(
      table,
      [
        { column: 'temp', type: 'numeric' },
        { column: 'habitat', type: 'factor' },
        { column: 'grazed', type: 'factor' },
        { columns: ['habitat', 'temp'], type: 'interaction' },
        { columns: ['habitat', 'grazed'], type: 'interaction' },
      ],
      { intercept: true, dropAliased: false },
    );
    expect(design.names).toEqual([
      'intercept',
      'temp',
      'habitat=reed',
      'habitat=sedge',
      'grazed=yes',
      'habitat=reed & temp',
      'habitat=sedge & temp',
      'habitat=reed & grazed=yes',
      'habitat=sedge & grazed=yes',
    ]);
    // 9 columns on 6 rows: with the aliasing check on, the surplus is dropped.
    expect(buildDesign(table, [{ columns: ['habitat', 'grazed'], type: 'interaction' }, { column: 'temp', type: 'spline', df: 5 }], { intercept: true }).design.p).toBeLessThanOrEqual(6);
    expect(col(design, 'habitat=sedge & temp')).toEqual([10.5, 0, 0, 0, 8.5, 0]);
    expect(col(design, 'habitat=reed & grazed=yes')).toEqual([0, 1, 0, 0, 0, 0]);
  });

  it('builds a numeric x numeric interaction as the product', () => {
    const t = { nrows: 3, columns: [columnFromNumbers('a', [1, 2, 3]), columnFromNumbers('b', [4, 5, 7])] };
    const { design } = buildDesign(t, [{ columns: ['a', 'b'], type: 'interaction' }], { intercept: false });
    expect(design.names).toEqual(['a & b']);
    expect(Array.from(design.data)).toEqual([4, 10, 21]);
  });

  it('uses only the rows asked for, and their levels', () => {
    const { design } = buildDesign(table, [{ column: 'habitat', type: 'factor' }], { intercept: true, rows: [0, 1, 4] });
    expect(design.n).toBe(3);
    expect(design.names).toEqual(['intercept', 'habitat=sedge']);
  });

  it('drops an aliased column with a warning that names the term', () => {
    const t = tableFromTexts(
      ['a', 'b', 'c'],
      [
        ['1', '2', 'x'],
        ['2', '4', 'y'],
        ['3', '6', 'x'],
        ['4', '8', 'y'],
      ],
    );
    const { design, warnings, aliased } = buildDesign(
      t,
      [
        { column: 'a', type: 'numeric' },
        { column: 'b', type: 'numeric' },
        { column: 'c', type: 'factor' },
      ],
      { intercept: true },
    );
    expect(aliased).toEqual(['b']);
    expect(design.names).toEqual(['intercept', 'a', 'c=y']);
    expect(warnings.find((w) => w.code === 'aliased-column')?.message).toMatch(/"b" \(term b\)/);
  });

  it('refuses text in a numeric column, naming the rows', () => {
    const t = tableFromTexts(['x'], [['1'], ['abc'], ['3']]);
    try {
      buildDesign(t, [{ column: 'x', type: 'numeric' }], { intercept: true });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(FitInputError);
      expect((e as FitInputError).rows).toEqual([1]);
      expect((e as Error).message).toMatch(/row 2 holds text \(e\.g\. "abc"\)/);
    }
  });

  it('refuses a reference level that is not in the data', () => {
    expect(() => buildDesign(table, [{ column: 'habitat', type: 'factor', reference: 'bog' }], { intercept: true })).toThrow(/"bog".*"open", "reed", "sedge"/);
  });

  it('rebuilds the same columns on new rows from an earlier coding', () => {
    const first = buildDesign(table, [{ column: 'habitat', type: 'factor' }, { column: 'temp', type: 'spline', df: 2 }], { intercept: true });
    const again = buildDesign(table, [{ column: 'habitat', type: 'factor' }, { column: 'temp', type: 'spline', df: 2 }], { intercept: true, rows: [2, 3], coding: first.levels });
    expect(again.design.names).toEqual(first.design.names);
    expect(col(again.design, 'temp[ns2]')[1]).toBeCloseTo(col(first.design, 'temp[ns2]')[3], 14);
  });
});

describe('natural spline basis against splines::ns (R)', () => {
  const ref = glmFixtures.ns; // source: splines::ns(x, df = 4) on MASS::epil ages, via make-glm.R
  it('places the knots as R does', () => {
    const k = splineKnots(ref.x, 4);
    expect(k.interior).toEqual(ref.knots);
    expect([...k.boundary]).toEqual(ref.boundary);
  });
  it('matches R basis values, extrapolation outside the range included (1e-12)', () => {
    const k = splineKnots(ref.x, 4);
    const b = naturalSplineBasis(ref.xNew, k);
    const n = ref.xNew.length;
    for (let i = 0; i < n; i++) for (let j = 0; j < 4; j++) expect(Math.abs(b[j * n + i] - ref.basis[i][j])).toBeLessThan(1e-12);
  });
  it('matches R with df = 1', () => {
    const b = naturalSplineBasis(ref.x, splineKnots(ref.x, 1));
    ref.basisDf1.forEach((v, i) => expect(Math.abs(b[i] - v)).toBeLessThan(1e-12));
  });
  it('names spline columns column[ns1], column[ns2] ...', () => {
    const t = { nrows: ref.x.length, columns: [columnFromNumbers('age', ref.x)] };
    const { design } = buildDesign(t, [{ column: 'age', type: 'spline', df: 3 }], { intercept: true });
    expect(design.names).toEqual(['intercept', 'age[ns1]', 'age[ns2]', 'age[ns3]']);
  });
  it('refuses more df than distinct values', () => {
    const t = { nrows: 4, columns: [columnFromNumbers('x', [1, 2, 1, 2])] };
    expect(() => buildDesign(t, [{ column: 'x', type: 'spline', df: 3 }], { intercept: true })).toThrow(/only 2 distinct values/);
  });
});

describe('findAliased', () => {
  it('finds a column that is a combination of earlier ones, keeps the earlier ones', () => {
    const n = 5;
    const a = [1, 2, 3, 4, 5];
    const b = [1, 0, 1, 0, 1];
    const c = a.map((v, i) => 2 * v - 3 * b[i]);
    const data = Float64Array.from([...a, ...b, ...c, ...a.map((v) => v * v)]);
    expect(findAliased(data, n, 4)).toEqual([2]);
  });
  it('treats an all-zero column as aliased', () => {
    expect(findAliased(Float64Array.from([1, 1, 1, 0, 0, 0]), 3, 2)).toEqual([1]);
  });
});
