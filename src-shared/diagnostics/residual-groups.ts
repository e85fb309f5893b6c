/**
 * Residuals against a table column (season, site): the level of each
 * residual's record and the levels in the contract's sorted order, with a
 * median per level to show a drift between seasons or a site that stands out.
 */
import type { DataTable } from '../data/table';
import { findColumn, sortLevels } from '../data/table';
import { DiagnosticsInputError } from './fitted-distribution';
import type { QuantileResiduals } from './quantile-residuals';

export interface ResidualGroups {
  readonly column: string;
  /** Levels in sorted order. */
  readonly levels: string[];
  /** Per residual: index of its level in `levels`. */
  readonly levelOf: Int32Array;
  /** Median residual of each level. */
  readonly median: number[];
  readonly count: number[];
}

function median(values: number[]): number {
  const s = [...values].sort((a, b) => a - b);
  const m = s.length >> 1;
  return s.length % 2 ? s[m] : (s[m - 1] + s[m]) / 2;
}

export function residualGroups(res: QuantileResiduals, table: DataTable, column: string): ResidualGroups {
  const col = findColumn(table, column);
  if (!col) {
    const names = table.columns.map((c) => `"${c.name}"`).join(', ');
    throw new DiagnosticsInputError('missing-column', `There is no column "${column}" to group the residuals by. The columns are: ${names}.`);
  }
  const texts = Array.from(res.rows, (r) => col.texts[r]);
  const blank = texts.findIndex((t) => t === '');
  if (blank >= 0) {
    throw new DiagnosticsInputError('blank-group', `Column "${column}" is blank in data row ${res.rows[blank] + 1}, so that residual has no group. Fill in the cell or group by another column.`);
  }
  const levels = sortLevels([...new Set(texts)]);
  const index = new Map(levels.map((l, k) => [l, k]));
  const levelOf = Int32Array.from(texts, (t) => index.get(t) as number);
  const byLevel: number[][] = levels.map(() => []);
  levelOf.forEach((g, i) => byLevel[g].push(res.residual[i]));
  return { column, levels, levelOf, median: byLevel.map(median), count: byLevel.map((v) => v.length) };
}
