/** The count-part terms of a spec: its predictors plus the time trend term. */
import type { DataTable } from '../data/table';
import { parseNumber, requireColumn, sortLevels } from '../data/table';
import type { ModelSpec, Term } from '../model/spec';
import { FitInputError } from './types';

/**
 * `time` with trend 'annual' adds the time column as a factor against `base`
 * (default the first time value in sorted order); 'linear' adds it as
 * numeric. Neither is added when the time column is already a main-effect
 * predictor.
 */
export function countTerms(table: DataTable, spec: ModelSpec, rows: readonly number[]): Term[] {
  const terms = [...spec.predictors];
  const time = spec.time;
  if (!time) return terms;
  if (terms.some((t) => t.type !== 'interaction' && t.column === time.column)) return terms;
  if (time.trend === 'linear') return [...terms, { column: time.column, type: 'numeric' }];
  let reference: string | undefined;
  if (time.base !== undefined) {
    const col = requireColumn(table, time.column);
    const levels = sortLevels([...new Set(rows.map((r) => col.texts[r]))]);
    const base = String(time.base);
    reference = levels.find((l) => l === base) ?? levels.find((l) => typeof time.base === 'number' && parseNumber(l) === time.base);
    if (reference === undefined) {
      throw new FitInputError(
        'unknown-time-base',
        `The base time ${base} does not occur in column "${time.column}" among the rows used; its values are ${levels.slice(0, 20).join(', ')}${levels.length > 20 ? ' ...' : ''}. Choose one of them as the base.`,
      );
    }
  }
  return [...terms, { column: time.column, type: 'factor', ...(reference !== undefined ? { reference } : {}) }];
}
