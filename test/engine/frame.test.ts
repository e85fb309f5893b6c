import { describe, expect, it } from 'vitest';
import { tableFromTexts } from '@shared/data/table';
import { frameOptions, modelFrame } from '@shared/engine/frame';
import { FitInputError } from '@shared/engine/types';
import { parseModelSpec } from '@shared/model/spec';

const table = tableFromTexts(
  ['count', 'effort_h', 'area', 'habitat', 'depth'],
  [
    ['3', '2', '10', 'reed', '1'],
    ['', '2', '10', 'reed', '1'],
    ['4', '1.5', '5', '', '2'],
    ['0', '4', '20', 'sedge', ''],
    ['6', '3', '10', 'sedge', '3'],
  ],
);

function thrown(f: () => unknown): FitInputError {
  try {
    f();
  } catch (e) {
    if (e instanceof FitInputError) return e;
    throw e;
  }
  throw new Error('expected a FitInputError');
}

describe('modelFrame', () => {
  it('drops rows with a blank in a used column and says how many and which', () => {
    const f = modelFrame(table, { response: 'count', offsets: [], columns: ['habitat'] });
    expect(f.rows).toEqual([0, 3, 4]);
    expect(f.warnings).toHaveLength(1);
    expect(f.warnings[0].code).toBe('dropped-rows');
    expect(f.warnings[0].message).toMatch(/^2 rows were left out .*data rows 2, 3; columns "count", "habitat"/);
  });

  it('ignores blanks in columns the model does not use (zero-part columns of a Poisson model)', () => {
    const spec = parseModelSpec({ response: 'count', distribution: 'poisson', zeroPredictors: [{ column: 'depth', type: 'numeric' }] });
    expect(modelFrame(table, frameOptions(spec)).rows).toEqual([0, 2, 3, 4]);
    const zip = parseModelSpec({ response: 'count', distribution: 'zip', zeroPredictors: [{ column: 'depth', type: 'numeric' }] });
    expect(modelFrame(table, frameOptions(zip)).rows).toEqual([0, 2, 4]);
  });

  it('adds several offsets, taking logs where asked', () => {
    const f = modelFrame(table, {
      response: 'count',
      offsets: [
        { column: 'effort_h', log: true },
        { column: 'area', log: false },
      ],
      columns: [],
      rows: [0, 4],
    });
    expect(f.hasOffset).toBe(true);
    expect(f.offset[0]).toBeCloseTo(Math.log(2) + 10, 14);
    expect(f.offset[1]).toBeCloseTo(Math.log(3) + 10, 14);
  });

  it('refuses a response that is not a non-negative whole number, listing 1-based rows', () => {
    const t = tableFromTexts(['y'], [['1'], ['2.5'], ['-1'], ['x'], ['4']]);
    const e = thrown(() => modelFrame(t, { response: 'y', offsets: [], columns: [] }));
    expect(e.code).toBe('bad-response');
    expect(e.rows).toEqual([1, 2, 3]);
    expect(e.message).toMatch(/data rows 2, 3, 4 do not/);
  });

  it('refuses a non-positive logged offset, naming rows, column and the fix', () => {
    const t = tableFromTexts(['y', 'effort'], [['1', '2'], ['2', '0'], ['0', '-1']]);
    const e = thrown(() => modelFrame(t, { response: 'y', offsets: [{ column: 'effort', log: true }], columns: [] }));
    expect(e.code).toBe('bad-offset');
    expect(e.rows).toEqual([1, 2]);
    expect(e.message).toMatch(/"effort".*data rows 2, 3.*set effort to a positive value or exclude the record/i);
  });

  it('names a missing column', () => {
    expect(() => modelFrame(table, { response: 'count', offsets: [], columns: ['habitta'] })).toThrow(/no column "habitta"/);
  });

  it('refuses a table whose rows are all incomplete', () => {
    const t = tableFromTexts(['y', 'x'], [['1', ''], ['', '2']]);
    expect(thrown(() => modelFrame(t, { response: 'y', offsets: [], columns: ['x'] })).code).toBe('no-rows');
  });
});
