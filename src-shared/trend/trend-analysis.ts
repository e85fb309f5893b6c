/**
 * A whole trend analysis of one table: the fit, annual indices, the
 * log-linear slope (for an annual spec, from a refit with a linear trend),
 * and on request a smooth trend, a change between periods and site-block
 * bootstrap or site-robust limits. The default part of the result is the
 * `trend --json` object of shared/cli-contract.md.
 */
import type { DataTable } from '../data/table';
import { createRng } from '../demo/prng';
import { fitModel } from '../engine/fit';
import { FitCancelled, type FitOutcome } from '../engine/types';
import type { FitSummary } from '../model/fit-result';
import type { ModelSpec } from '../model/spec';
import { TrendError } from './errors';
import { checkFinite } from './finite-check';
import { inThreadRunner, type FitJob, type FitRunner } from './fit-runner';
import { annualLogIndices, indexRows, linearLogIndices, type LogIndices } from './indices';
import { zFor, type ChangeInterval, type IndexRow } from './interval';
import { percentileLimits } from './percentile';
import { periodChange, type Period, type PeriodChange } from './period-change';
import { resampleSites, rowsBySite } from './resample-sites';
import { slopeOf } from './slope';
import { splineLogIndices } from './smooth';
import { modelTotals, type TotalsResult } from './totals';
import { annualTrendSpec, linearTrendSpec, robustSpec, splineTrendSpec } from './trend-specs';

export type LimitsMethod = 'wald' | 'robust' | 'bootstrap';

export interface TrendOptions {
  /** Season the indices are scaled to (default: the spec's base, else the first season). */
  base?: number | string;
  limits?: LimitsMethod;
  replicates?: number;
  seed?: number;
  /** Degrees of freedom of a natural-spline smooth trend. */
  smoothDf?: number;
  change?: readonly [Period, Period];
  /** Model-based totals over all sites per season, limits from this many draws of the annual effects. */
  totals?: { draws?: number };
  runner?: FitRunner;
  onProgress?: (done: number, total: number, stage: string) => void;
  signal?: { readonly aborted: boolean };
  /** Receives the main fit (of `spec`, or its site-robust variant with limits 'robust') and its spec, for reuse. */
  onMainFit?: (fit: FitOutcome, spec: ModelSpec) => void;
}

export interface TrendResult {
  fit: FitSummary;
  indices: IndexRow[];
  slope: ChangeInterval;
  method?: { indices: string; slope: string; base: number | string; level: number; replicates?: number; failedReplicates?: number; seed?: number };
  smooth?: { df: number; indices: IndexRow[]; method: string };
  change?: PeriodChange;
  totals?: TotalsResult;
}

/** What the bootstrap replicates and the main fit share: log indices and the log slope. */
interface TrendPoint {
  readonly log: LogIndices;
  readonly b: number;
  readonly change?: number;
}

export const DEFAULT_REPLICATES = 499;

/** The analysis of one table (the main fits run in this thread; bootstrap refits on the runner). */
export async function analyseTrend(table: DataTable, spec: ModelSpec, options: TrendOptions = {}): Promise<TrendResult> {
  if (!spec.time) throw new TrendError('no-time', 'The model spec has no "time" entry, so there is no trend to estimate. Add "time": { "column": "season", "trend": "annual" } (or "linear") to the spec.');
  const limits = options.limits ?? 'wald';
  const main = limits === 'robust' ? robustSpec(spec) : spec;
  const z = zFor(0.95);
  const progress = options.onProgress ?? (() => {});
  progress(0, 1, 'fitting the model');
  const fit = fitModel(table, main, { signal: options.signal });
  options.onMainFit?.(fit, main);
  const point = trendPoint(table, main, fit, undefined, options);
  const indices = indexRows(point.log, z);
  const slopeFit = main.time!.trend === 'annual' ? fitModel(table, linearTrendSpec(main), { signal: options.signal }) : fit;
  const slope = slopeOf(slopeFit, main.time!.column, z);
  const result: TrendResult = { fit: fit.summary, indices, slope: { perYear: slope.perYear, lower: slope.lower, upper: slope.upper } };
  const waldWord = limits === 'robust' ? 'Wald limits from the site-robust (sandwich) covariance' : 'Wald limits from the model covariance (delta method)';
  const indexWord = main.time!.trend === 'annual' ? '100 exp(g_t - g_base) from the annual effects' : '100 exp(b (t - t_base)) from the log-linear slope';
  result.method = {
    indices: `${indexWord}; ${waldWord}`,
    slope: `exp(b) - 1 of the log-linear slope${main.time!.trend === 'annual' ? ' from a refit with a linear trend' : ''}; ${waldWord}`,
    base: point.log.time.values[point.log.time.levels.indexOf(point.log.base)],
    level: 0.95,
  };
  if (options.smoothDf !== undefined) {
    progress(0, 1, 'fitting the smooth trend');
    const sFit = fitModel(table, splineTrendSpec(main, options.smoothDf), { signal: options.signal });
    const s = splineLogIndices(table, main, sFit, options.smoothDf, options.base ?? main.time!.base);
    result.smooth = { df: options.smoothDf, indices: indexRows(s, z), method: `natural cubic spline in ${main.time!.column} with ${options.smoothDf} df; pointwise ${waldWord}` };
  }
  const annualSpec = main.time!.trend === 'annual' ? main : annualTrendSpec(main);
  let annualFit: FitOutcome | undefined = main.time!.trend === 'annual' ? fit : undefined;
  const annualOutcome = () => (annualFit ??= fitModel(table, annualSpec, { signal: options.signal }));
  if (options.totals) result.totals = modelTotals(table, annualSpec, annualOutcome(), { draws: options.totals.draws, seed: options.seed });
  if (options.change) {
    result.change = periodChange(table, annualSpec, annualOutcome(), options.change[0], options.change[1]);
    if (limits === 'robust') result.change.method = result.change.method.replace('its covariance', 'its site-robust covariance');
  }
  if (limits === 'bootstrap') await bootstrapInto(result, table, main, point, options);
  checkFinite('index', result.indices, result.slope);
  if (result.change && ![result.change.ratio, result.change.lower, result.change.upper].every(Number.isFinite)) {
    throw new TrendError('not-finite', 'The change between the periods has no finite value or limits; look at the fit\'s warnings for the seasons involved.');
  }
  if (result.smooth) checkFinite('smooth index', result.smooth.indices);
  return result;
}

function trendPoint(table: DataTable, spec: ModelSpec, fit: FitOutcome, slopeFit: FitOutcome | undefined, options: TrendOptions): TrendPoint {
  const base = options.base ?? spec.time!.base;
  const log = spec.time!.trend === 'annual' ? annualLogIndices(table, spec, fit, base) : linearLogIndices(table, spec, fit, base);
  const b = slopeFit ? slopeOf(slopeFit, spec.time!.column).b : Number.NaN;
  const change = options.change && spec.time!.trend === 'annual' ? Math.log(periodChange(table, spec, fit, options.change[0], options.change[1]).ratio) : undefined;
  return { log, b, change };
}

/** Site-block bootstrap: percentile limits replace the Wald ones for the indices, the slope and the period change. */
async function bootstrapInto(result: TrendResult, table: DataTable, spec: ModelSpec, point: TrendPoint, options: TrendOptions): Promise<void> {
  const site = spec.site?.column;
  if (!site) throw new TrendError('bootstrap-needs-site', 'Bootstrap limits resample whole sites: add "site" to the model spec (e.g. "site": { "column": "pond", "effect": "random" }) or use --limits wald.');
  const R = options.replicates ?? DEFAULT_REPLICATES;
  if (!(Number.isInteger(R) && R >= 20)) throw new TrendError('few-replicates', `Bootstrap limits need at least 20 replicates (199 or more is usual); ${R} were asked.`);
  const rng = createRng(options.seed ?? 1);
  const groups = rowsBySite(table, site);
  const annual = spec.time!.trend === 'annual';
  const jobs: FitJob[] = [];
  const tables: DataTable[] = [];
  for (let r = 0; r < R; r++) {
    const t = resampleSites(table, site, groups, rng);
    tables.push(t);
    jobs.push({ table: t, spec });
    if (annual) jobs.push({ table: t, spec: linearTrendSpec(spec) });
  }
  const runner = options.runner ?? inThreadRunner;
  const progress = options.onProgress ?? (() => {});
  const done = await runner(jobs, { signal: options.signal, onDone: (d, n) => progress(d, n, 'bootstrap refits') });
  if (options.signal?.aborted) throw new FitCancelled();
  const per = annual ? 2 : 1;
  const L = point.log.time.levels.length;
  const logs: number[][] = Array.from({ length: L }, () => []);
  const slopes: number[] = [];
  const changes: number[] = [];
  let failed = 0;
  for (let r = 0; r < R; r++) {
    const a = done[r * per];
    const l = done[r * per + per - 1];
    if (!a.ok || !l.ok || !a.outcome.summary.converged || !l.outcome.summary.converged) {
      failed++;
      continue;
    }
    try {
      const rep = trendPoint(tables[r], spec, a.outcome, l.outcome, { ...options, base: point.log.base });
      point.log.time.levels.forEach((lev, i) => {
        const j = rep.log.time.levels.indexOf(lev);
        logs[i].push(j >= 0 ? rep.log.log[j] : Number.NaN);
      });
      slopes.push(rep.b);
      if (rep.change !== undefined) changes.push(rep.change);
    } catch {
      failed++;
    }
  }
  if (R - failed < 20) throw new TrendError('bootstrap-failed', `Only ${R - failed} of ${R} bootstrap refits converged, too few for limits. Simplify the model or use --limits wald.`);
  result.indices = result.indices.map((row, i) => {
    const p = percentileLimits(logs[i]);
    const isBase = point.log.time.levels[i] === point.log.base;
    return { ...row, lower: isBase ? 100 : 100 * Math.exp(p.lower), upper: isBase ? 100 : 100 * Math.exp(p.upper) };
  });
  const ps = percentileLimits(slopes);
  result.slope = { perYear: result.slope.perYear, lower: Math.expm1(ps.lower), upper: Math.expm1(ps.upper) };
  if (result.change && changes.length >= 20) {
    const pc = percentileLimits(changes);
    result.change = { ...result.change, lower: Math.exp(pc.lower), upper: Math.exp(pc.upper), method: 'mean log index of each period from the annual fit; site-block bootstrap percentile limits' };
  }
  const boot = `site-block bootstrap percentile limits (${R - failed} refits with sites of "${site}" resampled with replacement)`;
  result.method = { ...result.method!, indices: result.method!.indices.replace(/; .*$/, `; ${boot}`), slope: result.method!.slope.replace(/; [^;]*$/, `; ${boot}`), replicates: R, failedReplicates: failed, seed: options.seed ?? 1 };
}
