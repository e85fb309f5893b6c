import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { findColumn, splitBy, type DataTable } from '@shared/data/table';
import { FitCancelled } from '@shared/engine/types';
import type { ModelSpec } from '@shared/model/spec';
import { compositeTrend, type CompositeResult } from '@shared/trend/composite';
import type { FitRunner } from '@shared/trend/fit-runner';
import { decisionFlags, DEFAULT_HORIZON, DEFAULT_THRESHOLDS, type DecisionFlags } from '@shared/trend/flags';
import type { IndexRow } from '@shared/trend/interval';
import { parsePeriods } from '@shared/trend/period-change';
import { poolRunner } from '@shared/trend/pool-runner';
import { analyseTrend, DEFAULT_REPLICATES, type LimitsMethod, type TrendOptions, type TrendResult } from '@shared/trend/trend-analysis';
import { loadDataTable } from '../../../src-main/data/load-table';
import { parseArgs, requireOption, wholeNumber, type ParsedArgs } from '../args';
import { progressPrinter } from '../progress';
import { UsageError, type CliCommand, type CliIO } from '../command';
import { fitAsText } from '../format/fit-text';
import { fmt, layoutColumns } from '../format/number';
import { readSpecFile } from '../spec-file';
import { createFitPool, defaultJobs } from '../worker/fit-pool';
import { interruptible } from '../interrupt';

export const trend: CliCommand = {
  name: 'trend',
  summary: 'Annual indices and the trend of a count series, with limits, flags and composites.',
  usage: [
    '  tallywise trend --data FILE --spec FILE [--json] [options]',
    '',
    '  --data        the cleaned table (.csv or .xlsx); --sheet NAME picks a workbook sheet',
    '  --spec        the model spec (JSON) with a "time" entry (annual or linear)',
    '  --json        print one JSON object: {fit, indices, slope, method, ...} (shared/cli-contract.md)',
    '  --base T      scale the indices to season T (= 100) instead of the spec\'s base',
    '  --smooth DF   add a natural-spline trend in time with DF degrees of freedom, pointwise limits',
    '  --change A-B:C-D  change from seasons A..B to C..D (mean log index of each period), with limits',
    '  --totals      model-based totals over all sites per season (observed where surveyed, predicted',
    '                where not); limits by simulation from the covariance of the annual effects',
    '  --limits M    wald (default: model covariance), robust (site-clustered sandwich) or bootstrap',
    '                (site-block bootstrap: sites resampled with replacement, refitted, percentile limits)',
    `  --replicates N  bootstrap replicates (default ${DEFAULT_REPLICATES}; 199 with --composite), or draws for --totals (default 1000)`,
    '  --seed S      seed of the bootstrap and of the totals simulation (default 1)',
    '  --jobs N      worker threads for bootstrap refits (default: one per core; 0 = this process)',
    `  --horizon H   seasons to project the trend over for the decision flags (default ${DEFAULT_HORIZON})`,
    '  --thresholds LIST  reductions in percent compared with the projection (default 30,50,80)',
    '  --flags       include the decision flags in the JSON output (the text form always shows them)',
    '  --by COLUMN   one trend per value of COLUMN (e.g. species); JSON {"groups": [{"group", ...}]}',
    '  --composite   with --by: the geometric-mean composite index of the groups, bootstrap limits',
    '  --weights W   with --composite: group weights as key=w,key=w or a JSON file {"key": w}',
    '',
    '  Progress goes to stderr; Ctrl-C stops a bootstrap (exit 130). Exit status 1 when a fit did not',
    '  converge; 2 for bad usage or unreadable input. The decision flags are not a Red List assessment.',
  ].join('\n'),
  async run(argv, io) {
    const args = parseArgs(argv, {
      values: ['data', 'spec', 'sheet', 'base', 'smooth', 'change', 'limits', 'replicates', 'seed', 'jobs', 'horizon', 'thresholds', 'by', 'weights'],
      flags: ['json', 'totals', 'flags', 'composite'],
    });
    const dataPath = resolve(requireOption(args, 'data', 'the data file'));
    const spec = await readSpecFile(resolve(requireOption(args, 'spec', 'the model spec file')));
    if (!spec.time) throw new UsageError('The model spec has no "time" entry, so there is no trend. Add e.g. "time": { "column": "season", "trend": "annual" } to the spec.');
    const opts = trendOptions(args);
    const flagsWanted = { horizon: wholeNumber(args, 'horizon', 1) ?? DEFAULT_HORIZON, thresholds: parseThresholds(args.options.get('thresholds')) };
    const by = args.options.get('by');
    if (args.flags.has('composite') && by === undefined) throw new UsageError('--composite combines the trends of the groups of --by COLUMN (e.g. --by species); add --by.');
    if (args.options.has('weights') && !args.flags.has('composite')) throw new UsageError('--weights goes with --composite.');
    const table = await loadDataTable(dataPath, { sheet: args.options.get('sheet') });
    const needsPool = opts.limits === 'bootstrap' || args.flags.has('composite');
    const jobs = wholeNumber(args, 'jobs', 0) ?? defaultJobs();
    const fitPool = needsPool ? createFitPool(jobs) : null;
    if (fitPool) io.err(fitPool.mode === 'threads' ? `Refits run on ${fitPool.pool.size} worker thread${fitPool.pool.size > 1 ? 's' : ''}.` : 'Refits run in this process, one at a time.');
    const progress = progressPrinter(io);
    try {
      return await interruptible(io, () => 'Stopped: the bootstrap was interrupted; nothing was printed.', async (signal) => {
        const runner: FitRunner | undefined = fitPool ? poolRunner(fitPool.pool, signal) : undefined;
        const options: TrendOptions = { ...opts, runner, signal, onProgress: progress };
        if (by === undefined) {
          const result = await analyseTrend(table, spec, options);
          const flags = decisionFlags(result.slope, flagsWanted.horizon, flagsWanted.thresholds);
          const wantFlags = args.flags.has('flags') || args.options.has('horizon') || args.options.has('thresholds');
          if (args.flags.has('json')) io.out(JSON.stringify(wantFlags ? { ...result, flags } : result, null, 2));
          else io.out(trendAsText(result, flags));
          return result.fit.converged ? 0 : 1;
        }
        return await byGroup(table, spec, by, args, options, flagsWanted, io);
      });
    } finally {
      fitPool?.pool.dispose();
    }
  },
};

async function byGroup(table: DataTable, spec: ModelSpec, by: string, args: ParsedArgs, options: TrendOptions, flagsWanted: { horizon: number; thresholds: number[] }, io: CliIO): Promise<number> {
  if (!findColumn(table, by)) throw new UsageError(`There is no column "${by}" to group by (--by). The columns are: ${table.columns.map((c) => `"${c.name}"`).join(', ')}.`);
  const groups = splitBy(table, by).filter((g) => g.key !== '');
  const out: { group: string; result?: TrendResult; error?: string; flags?: DecisionFlags }[] = [];
  let attention = 0;
  for (const g of groups) {
    io.err(`Trend for ${by} "${g.key}" ...`);
    try {
      const result = await analyseTrend(g.table, spec, options);
      if (!result.fit.converged) attention++;
      out.push({ group: g.key, result, flags: decisionFlags(result.slope, flagsWanted.horizon, flagsWanted.thresholds) });
    } catch (err) {
      if (err instanceof FitCancelled) throw err;
      attention++;
      out.push({ group: g.key, error: (err as Error).message });
    }
  }
  let composite: CompositeResult | undefined;
  if (args.flags.has('composite')) {
    composite = await compositeTrend(table, spec, by, {
      base: options.base,
      weights: parseWeights(args.options.get('weights')),
      replicates: wholeNumber(args, 'replicates', 1) ?? 199,
      seed: options.seed,
      runner: options.runner,
      signal: options.signal,
      onProgress: options.onProgress,
    });
  }
  if (args.flags.has('json')) {
    const groupsJson = out.map((o) => (o.result ? { group: o.group, ...o.result, ...(args.flags.has('flags') ? { flags: o.flags } : {}) } : { group: o.group, error: o.error }));
    io.out(JSON.stringify({ groups: groupsJson, ...(composite ? { composite: composite.composite } : {}) }, null, 2));
  } else {
    for (const o of out) io.out(`== ${by} ${o.group} ==\n${o.result ? trendAsText(o.result, o.flags!) : `Not fitted: ${o.error}`}\n`);
    if (composite) io.out(`== Composite of ${out.length} groups ==\n${indexTable(composite.composite.indices)}\n  Limits: ${composite.composite.method}.`);
  }
  return attention ? 1 : 0;
}

function trendOptions(args: ParsedArgs): Pick<TrendOptions, 'base' | 'limits' | 'replicates' | 'seed' | 'smoothDf' | 'change' | 'totals'> {
  const limits = (args.options.get('limits') ?? 'wald') as LimitsMethod;
  if (!['wald', 'robust', 'bootstrap'].includes(limits)) throw new UsageError(`--limits takes wald, robust or bootstrap, not "${limits}".`);
  const replicates = wholeNumber(args, 'replicates', 1);
  if (replicates !== undefined && limits !== 'bootstrap' && !args.flags.has('totals') && !args.flags.has('composite')) {
    throw new UsageError('--replicates goes with --limits bootstrap, --composite or --totals.');
  }
  if (replicates !== undefined && replicates < 20 && (limits === 'bootstrap' || args.flags.has('composite'))) {
    throw new UsageError(`Bootstrap limits need at least 20 replicates (199 or more is usual), not ${replicates}.`);
  }
  const base = args.options.get('base');
  const smoothDf = wholeNumber(args, 'smooth', 1);
  const changeText = args.options.get('change');
  let change: TrendOptions['change'];
  try {
    change = changeText === undefined ? undefined : parsePeriods(changeText);
  } catch (err) {
    throw new UsageError(`--change: ${(err as Error).message}`);
  }
  return {
    base: base === undefined ? undefined : Number.isNaN(Number(base)) ? base : Number(base),
    limits,
    replicates: limits === 'bootstrap' ? replicates : undefined,
    seed: wholeNumber(args, 'seed', 0),
    smoothDf,
    change,
    totals: args.flags.has('totals') ? { draws: limits === 'bootstrap' ? undefined : replicates } : undefined,
  };
}

function parseThresholds(text: string | undefined): number[] {
  if (text === undefined) return [...DEFAULT_THRESHOLDS];
  const parts = text.split(',').map((s) => Number(s.trim()));
  if (parts.some((p) => !(p > 0 && p < 100))) throw new UsageError(`--thresholds takes reductions in percent between 0 and 100, separated by commas (e.g. 30,50,80), not "${text}".`);
  return parts.map((p) => p / 100);
}

function parseWeights(text: string | undefined): Record<string, number> | undefined {
  if (text === undefined) return undefined;
  let pairs: [string, unknown][];
  if (text.trim().endsWith('.json')) {
    try {
      pairs = Object.entries(JSON.parse(readFileSync(resolve(text), 'utf8')) as Record<string, unknown>);
    } catch (err) {
      throw new UsageError(`Cannot read the weights file ${text} as JSON {"key": weight, ...} (${(err as Error).message}).`);
    }
  } else {
    pairs = text.split(',').map((p) => {
      const eq = p.lastIndexOf('=');
      if (eq <= 0) throw new UsageError(`--weights takes key=weight pairs separated by commas (e.g. toad=1,frog=2), not "${p}".`);
      return [p.slice(0, eq).trim(), Number(p.slice(eq + 1))];
    });
  }
  for (const [k, w] of pairs) if (typeof w !== 'number' || !(w >= 0)) throw new UsageError(`The weight of "${k}" must be a number of at least 0.`);
  return Object.fromEntries(pairs) as Record<string, number>;
}

function indexTable(rows: readonly IndexRow[]): string {
  const body = rows.map((r) => [String(r.time), fmt(r.index, 1), fmt(r.lower, 1), fmt(r.upper, 1)]);
  return layoutColumns([['season', 'index', 'lower 95%', 'upper 95%'], ...body], [false, true, true, true])
    .map((l) => `  ${l}`)
    .join('\n');
}

const pct = (x: number) => `${x >= 0 ? '+' : ''}${fmt(100 * x, 1)}%`;

/** The readable form of a trend analysis. */
export function trendAsText(r: TrendResult, flags: DecisionFlags): string {
  const lines = [fitAsText(r.fit), '', `Indices (base ${r.method?.base} = 100)`, indexTable(r.indices), `  Limits: ${r.method?.indices}.`, ''];
  lines.push(`Trend per season: ${pct(r.slope.perYear)} (95% limits ${pct(r.slope.lower)} to ${pct(r.slope.upper)})`, `  ${r.method?.slope}.`);
  if (r.smooth) lines.push('', `Smooth trend (${r.smooth.df} df)`, indexTable(r.smooth.indices), `  ${r.smooth.method}.`);
  if (r.change) {
    const c = r.change;
    lines.push('', `Change from ${c.from.first}-${c.from.last} to ${c.to.first}-${c.to.last}: ${pct(c.ratio - 1)} (95% limits ${pct(c.lower - 1)} to ${pct(c.upper - 1)})`, `  ${c.method}.`);
  }
  if (r.totals) {
    const body = r.totals.totals.map((t) => [String(t.time), fmt(t.total, 1), fmt(t.lower, 1), fmt(t.upper, 1), `${t.surveyedSites} of ${t.sites}`, fmt(t.predicted, 1)]);
    lines.push('', 'Totals over all sites', ...layoutColumns([['season', 'total', 'lower 95%', 'upper 95%', 'sites surveyed', 'predicted part'], ...body], [false, true, true, true, true, true]).map((l) => `  ${l}`), `  ${r.totals.method}.`);
  }
  lines.push('', `Over ${flags.horizon} seasons at this rate: ${pct(flags.projected.change)} (95% limits ${pct(flags.projected.lower)} to ${pct(flags.projected.upper)})`, `  ${flags.summary}`);
  for (const t of flags.thresholds) lines.push(`  - ${t.sentence}`);
  lines.push(`  Caution: ${flags.caution}`);
  return lines.join('\n');
}
