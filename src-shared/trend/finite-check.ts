/** A last check that a trend result holds no NaN or infinite number where a reader expects one. */
import { TrendError } from './errors';
import type { IndexRow } from './interval';

/** Throws a TrendError naming the first season (or the slope) whose value or limits are not finite. */
export function checkFinite(what: string, rows: readonly IndexRow[], slope?: { perYear: number; lower: number; upper: number }): void {
  for (const r of rows) {
    if (![r.index, r.lower, r.upper].every(Number.isFinite)) {
      throw new TrendError('not-finite', `The ${what} for season ${r.time} has no finite value or limits (the fit's covariance is not usable there, e.g. a season with only zeros or an estimate on a boundary). Look at the fit's warnings; leave that season out or choose a simpler model.`);
    }
  }
  if (slope && ![slope.perYear, slope.lower, slope.upper].every(Number.isFinite)) {
    throw new TrendError('not-finite', `The ${what} slope has no finite value or limits (the fit's covariance is not usable). Look at the fit's warnings and simplify the model.`);
  }
}
