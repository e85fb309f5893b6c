/** Variants of a trend spec: the same model with the time term as a slope, a spline, or site-robust SEs. */
import type { ModelSpec } from '../model/spec';
import { timeColumnOf } from './time-levels';

/** The spec with a log-linear slope on the time column (predictors naming the time column removed). */
export function linearTrendSpec(spec: ModelSpec): ModelSpec {
  const column = timeColumnOf(spec);
  return { ...spec, predictors: withoutTime(spec, column), time: { column, trend: 'linear' } };
}

/** The spec with an annual factor on the time column against `base` (default the first season). */
export function annualTrendSpec(spec: ModelSpec, base?: number | string): ModelSpec {
  const column = timeColumnOf(spec);
  return { ...spec, predictors: withoutTime(spec, column), time: { column, trend: 'annual', ...(base !== undefined ? { base } : {}) } };
}

/** The spec with a natural cubic spline of `df` degrees of freedom in time. */
export function splineTrendSpec(spec: ModelSpec, df: number): ModelSpec {
  const column = timeColumnOf(spec);
  return { ...spec, predictors: [...withoutTime(spec, column), { column, type: 'spline', df }], time: { column, trend: 'linear' } };
}

/** The spec with site-clustered sandwich SEs. */
export function robustSpec(spec: ModelSpec): ModelSpec {
  return { ...spec, robust: 'site' };
}

function withoutTime(spec: ModelSpec, column: string): ModelSpec['predictors'] {
  return spec.predictors.filter((t) => t.type === 'interaction' || t.column !== column);
}
