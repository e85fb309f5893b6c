/** Percentile limits of bootstrap or simulation replicates (type-7 sample quantiles). */
import { quantile7 } from '../engine/design/spline';

/** Lower and upper percentile limits at a confidence level, from finite replicate values. */
export function percentileLimits(values: ArrayLike<number>, level = 0.95): { lower: number; upper: number } {
  const finite = Float64Array.from(Array.from(values).filter((v) => Number.isFinite(v))).sort();
  if (finite.length < 2) return { lower: Number.NaN, upper: Number.NaN };
  const a = (1 - level) / 2;
  return { lower: quantile7(finite, a), upper: quantile7(finite, 1 - a) };
}
