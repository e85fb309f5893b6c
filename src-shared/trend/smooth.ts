/**
 * A smooth trend: the time column as a natural cubic spline (the engine's
 * basis, its knots at quantiles of the time values in the rows used), the
 * index at each season against the base 100 exp(s(t) - s(base)) with
 * pointwise Wald limits from the spline coefficients' covariance.
 */
import type { DataTable } from '../data/table';
import { parseNumber, requireColumn } from '../data/table';
import { naturalSplineBasis, splineKnots } from '../engine/design/spline';
import type { FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { contrast, type Weight } from './contrast';
import { TrendError } from './errors';
import type { LogIndices } from './indices';
import { resolveLevel, timeLevels } from './time-levels';

/** Log indices from a fit of splineTrendSpec(spec, df). */
export function splineLogIndices(table: DataTable, spec: ModelSpec, outcome: FitOutcome, df: number, base?: number | string): LogIndices {
  const time = timeLevels(table, spec, outcome);
  if (!time.numeric) throw new TrendError('time-not-numeric', `A smooth trend needs numbers in "${time.column}". Recode the seasons as numbers.`);
  const col = requireColumn(table, time.column);
  const x = Float64Array.from(outcome.rows, (r) => col.values[r]);
  const knots = splineKnots(x, df);
  const at = Float64Array.from(time.levels, (l) => parseNumber(l));
  const basis = naturalSplineBasis(at, knots);
  const L = at.length;
  const b = base === undefined ? time.levels[0] : resolveLevel(time, base);
  const ib = time.levels.indexOf(b);
  const log = new Float64Array(L);
  const se = new Float64Array(L);
  for (let i = 0; i < L; i++) {
    const weights: Weight[] = [];
    for (let j = 0; j < df; j++) weights.push({ name: `${time.column}[ns${j + 1}]`, weight: basis[j * L + i] - basis[j * L + ib] });
    const e = contrast(outcome, weights);
    log[i] = e.estimate;
    se[i] = e.se;
  }
  return { time, base: b, log, se };
}
