import { levelsOf, requireColumn, selectRows, type DataTable } from '../data/table';

/** Part `index` (1-based) of `count` parts of a sorted group list. */
export interface Shard {
  index: number;
  count: number;
}

/** One group to fit: its key, its place in the sorted list of all groups, and its rows. */
export interface GroupJob {
  key: string;
  /** 0-based position in the sorted list of every group of the column. */
  position: number;
  /** The group's rows in the whole table (0-based); row i of `table` is row rows[i] there. */
  rows: readonly number[];
  table: DataTable;
}

export interface GroupPlan {
  column: string;
  /** Every group of the column, sorted (numeric order when all are numbers, else by code point). */
  allKeys: string[];
  /** The groups to fit here (all, or the shard's). */
  jobs: GroupJob[];
  /** 0-based table rows with a blank cell in the column; they belong to no group. */
  blankRows: number[];
}

/** Whether the group at 0-based `position` of the sorted list belongs to the shard: position ≡ index − 1 (mod count). */
export function inShard(position: number, shard: Shard): boolean {
  return position % shard.count === shard.index - 1;
}

/**
 * Splits a table by the cell texts of one column into the groups to fit.
 * With a shard, only the groups whose position in the sorted list of all
 * groups is ≡ index − 1 (mod count) are kept, so that shards 1..count
 * together hold every group exactly once, on any machine.
 */
export function planGroups(table: DataTable, column: string, shard?: Shard): GroupPlan {
  const col = requireColumn(table, column);
  const allKeys = levelsOf(col);
  const rowsOf = new Map<string, number[]>(allKeys.map((k) => [k, []]));
  const blankRows: number[] = [];
  col.texts.forEach((t, i) => {
    if (t === '') blankRows.push(i);
    else rowsOf.get(t)!.push(i);
  });
  const jobs: GroupJob[] = [];
  allKeys.forEach((key, position) => {
    if (!shard || inShard(position, shard)) {
      const rows = rowsOf.get(key)!;
      jobs.push({ key, position, rows, table: selectRows(table, rows) });
    }
  });
  return { column, allKeys, jobs, blankRows };
}
