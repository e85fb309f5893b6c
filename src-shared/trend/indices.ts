/**
 * Annual indices from a fit with the time column as a factor: the log index
 * of season t against base b is g_t - g_b (g of the fit's reference season
 * is 0), its variance V_tt + V_bb - 2 V_tb from the fit's covariance; the
 * index is 100 exp(g_t - g_b), its limits exp of the Wald limits, times 100
 * (shared/cli-contract.md). With a linear trend the "index" is the fitted
 * log-linear curve 100 exp(b (t - t_b)).
 */
import type { DataTable } from '../data/table';
import { parseNumber } from '../data/table';
import type { FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { contrast, coefficientIndex, type Weight } from './contrast';
import { TrendError } from './errors';
import { indexFromLog, type IndexRow } from './interval';
import { fittedBase, levelTerm, resolveLevel, timeLevels, type TimeLevels } from './time-levels';

/** Log indices of every season against a base, with their standard errors. */
export interface LogIndices {
  readonly time: TimeLevels;
  readonly base: string;
  /** g_t - g_base per level, in the order of time.levels. */
  readonly log: Float64Array;
  readonly se: Float64Array;
}

/** Weights of log index t - base over the annual coefficients of a fit. */
export function annualWeights(outcome: Pick<FitOutcome, 'betaNames'>, time: TimeLevels, reference: string, level: string, base: string): Weight[] {
  const out: Weight[] = [];
  const add = (l: string, w: number) => {
    if (l === reference) return;
    const name = levelTerm(time.column, l);
    if (!outcome.betaNames.includes(name)) {
      throw new TrendError('season-not-estimable', `The season ${l} of "${time.column}" has no estimate in the fit (its column was dropped, e.g. aliased with another term). Leave that season out or simplify the model.`);
    }
    out.push({ name, weight: w });
  };
  add(level, 1);
  add(base, -1);
  return out;
}

/**
 * Log indices from an annual fit; `base` (default the fit's own base) may be
 * any season. With `se: false` the fit's covariance may be empty of
 * numbers (a fit without inference, NaN) and the SEs are NaN.
 */
export function annualLogIndices(table: DataTable, spec: ModelSpec, outcome: FitOutcome, base?: number | string, options: { se?: boolean } = {}): LogIndices {
  const time = timeLevels(table, spec, outcome);
  const reference = fittedBase(time, spec);
  const b = base === undefined ? reference : resolveLevel(time, base);
  const log = new Float64Array(time.levels.length);
  const se = new Float64Array(time.levels.length);
  time.levels.forEach((level, i) => {
    const e = level === b ? { estimate: 0, se: 0 } : contrast(outcome, annualWeights(outcome, time, reference, level, b));
    log[i] = e.estimate;
    se[i] = options.se === false ? Number.NaN : e.se;
  });
  return { time, base: b, log, se };
}

/** Log indices of the fitted log-linear curve b (t - t_base). */
export function linearLogIndices(table: DataTable, spec: ModelSpec, outcome: FitOutcome, base?: number | string): LogIndices {
  const time = timeLevels(table, spec, outcome);
  if (!time.numeric) throw new TrendError('time-not-numeric', `A linear trend needs numbers in "${time.column}"; it holds ${time.levels.find((l) => Number.isNaN(parseNumber(l)))}. Use an annual trend or recode the column.`);
  const b = base === undefined ? (spec.time?.base !== undefined ? resolveLevel(time, spec.time.base) : time.levels[0]) : resolveLevel(time, base);
  const j = coefficientIndex(outcome, time.column);
  if (j < 0) throw new TrendError('missing-coefficient', `The fit has no slope on "${time.column}".`);
  const s = contrast(outcome, [{ name: time.column, weight: 1 }]);
  const t0 = parseNumber(b);
  const log = new Float64Array(time.levels.length);
  const se = new Float64Array(time.levels.length);
  time.levels.forEach((l, i) => {
    const d = parseNumber(l) - t0;
    log[i] = s.estimate * d;
    se[i] = s.se * Math.abs(d);
  });
  return { time, base: b, log, se };
}

/** Published rows: 100 exp(g) with Wald limits. */
export function indexRows(li: LogIndices, z?: number): IndexRow[] {
  return li.time.levels.map((_, i) => indexFromLog(li.time.values[i], li.log[i], li.se[i], z));
}
