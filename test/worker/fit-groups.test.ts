import { describe, expect, it } from 'vitest';
import { columnFromNumbers, tableFromTexts } from '@shared/data/table';
import { errorInWholeTable } from '@shared/worker/fit-batch';
import { inShard, planGroups } from '@shared/worker/fit-groups';
import { groupLine, needsAttention, parseGroupLine } from '@shared/worker/group-lines';

// Splitting a table into groups for `fit --by`, the shard rule, and the
// JSON-line shape that `fit --by` writes and `merge` reads.

const table = tableFromTexts(
  ['species', 'count'],
  [
    ['tern', '1'],
    ['heron', '2'],
    ['', '9'],
    ['gull', '3'],
    ['heron', '4'],
    ['tern', '5'],
  ],
);

describe('planGroups', () => {
  it('groups rows by cell text in sorted order, keeps each group\'s whole-table rows, and sets blanks aside', () => {
    const plan = planGroups(table, 'species');
    expect(plan.allKeys).toEqual(['gull', 'heron', 'tern']);
    expect(plan.jobs.map((j) => [j.key, j.position, [...j.rows]])).toEqual([
      ['gull', 0, [3]],
      ['heron', 1, [1, 4]],
      ['tern', 2, [0, 5]],
    ]);
    const heron = plan.jobs[1].table;
    expect(Array.from(heron.columns[1].values)).toEqual([2, 4]);
    expect(plan.blankRows).toEqual([2]);
  });

  it('numeric group keys sort in numeric order (cli-contract.md level order)', () => {
    const t = { nrows: 4, columns: [columnFromNumbers('year', [10, 9, 100, 9])] };
    expect(planGroups(t, 'year').allKeys).toEqual(['9', '10', '100']);
  });

  it('shards 1..n are disjoint and together hold every group once, for any n', () => {
    const keys = Array.from({ length: 23 }, (_, i) => `sp${String(i).padStart(2, '0')}`);
    const t = tableFromTexts(['species'], keys.map((k) => [k]));
    for (const n of [1, 2, 3, 7, 23, 30]) {
      const seen: string[] = [];
      for (let i = 1; i <= n; i++) seen.push(...planGroups(t, 'species', { index: i, count: n }).jobs.map((j) => j.key));
      expect(seen.sort(), `n = ${n}`).toEqual(keys);
    }
    expect(inShard(0, { index: 1, count: 3 })).toBe(true);
    expect(inShard(4, { index: 2, count: 3 })).toBe(true);
    expect(inShard(4, { index: 1, count: 3 })).toBe(false);
  });

  it('an unknown column is an error listing the columns there are', () => {
    expect(() => planGroups(table, 'site')).toThrow(/no column "site".*"species", "count"/);
  });
});

describe('errorInWholeTable', () => {
  it('gives the rows an error names in the whole table, and says the message counted within the group', () => {
    const job = planGroups(table, 'species').jobs[2]; // tern: rows 0 and 5
    const e = errorInWholeTable({ name: 'FitInputError', message: 'Data row 2 has a negative count.', rows: [1] }, job);
    expect(e.rows).toEqual([5]);
    expect(e.message).toBe('Data row 2 has a negative count. (Row numbers count the rows of group "tern" only; in the whole table they are data row 6.)');
    const plain = { name: 'FitInputError', message: 'All counts are zero.' };
    expect(errorInWholeTable(plain, job)).toBe(plain);
  });
});

describe('group lines', () => {
  it('a failed group becomes {group, error: {name, message}}; parse reads back what was written', () => {
    const line = groupLine({ group: 'gull', position: 0, error: { name: 'FitInputError', message: 'All zero.', code: 'all-zero', rows: [3] } });
    expect(line).toEqual({ group: 'gull', error: { name: 'FitInputError', message: 'All zero.' } });
    expect(needsAttention(line)).toBe(true);
    expect(parseGroupLine(JSON.stringify(line), 'a.jsonl line 1')).toEqual(line);
  });

  it('parse refuses lines that are not group lines, naming the place', () => {
    expect(() => parseGroupLine('[1,2]', 'a.jsonl line 4')).toThrow(/^a\.jsonl line 4 has no "group"/);
    expect(() => parseGroupLine('{"group":"x"}', 'b line 2')).toThrow(/b line 2 \(group "x"\) must hold either/);
    expect(() => parseGroupLine('{"group":"x","fit":{"converged":true},"error":{"name":"E","message":"m"}}', 'c line 1')).toThrow(/either/);
    expect(needsAttention(parseGroupLine('{"group":"x","fit":{"converged":false}}', 'd'))).toBe(true);
    expect(needsAttention(parseGroupLine('{"group":"x","fit":{"converged":true}}', 'd'))).toBe(false);
  });
});
