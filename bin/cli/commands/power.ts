import { resolve } from 'node:path';
import { poissonTrendPower } from '@shared/trend/power-analytic';
import { DEFAULT_DESIGN, designProblem, type PowerDesign } from '@shared/trend/power-design';
import { designFromFit } from '@shared/trend/power-from-fit';
import { powerStudy, type PowerStudy } from '@shared/trend/power-simulation';
import { poolRunner } from '@shared/trend/pool-runner';
import { loadDataTable } from '../../../src-main/data/load-table';
import { parseArgs, type ParsedArgs } from '../args';
import { UsageError, type CliCommand } from '../command';
import { fmt, layoutColumns } from '../format/number';
import { readSpecFile } from '../spec-file';
import { createFitPool, defaultJobs } from '../worker/fit-pool';
import { interruptible } from '../interrupt';

const d = DEFAULT_DESIGN;

export const power: CliCommand = {
  name: 'power',
  summary: 'Chance that a monitoring design detects a given trend, by simulating future programmes.',
  usage: [
    '  tallywise power [design values] [--json]',
    '  tallywise power --from-fit --data FILE --spec FILE [--sheet NAME] [design values to change]',
    '',
    `  --sites LIST      numbers of sites to compare, e.g. 10,20,40 (default ${d.sites})`,
    `  --seasons LIST    numbers of seasons to compare, e.g. 5,10,15 (default ${d.seasons})`,
    `  --visits N        visits per site and season (default ${d.visits})`,
    `  --mean-count M    mean count of one visit at a typical site in the first season (default ${d.meanCount})`,
    `  --theta T         negative-binomial size (variance mu + mu^2/T; default ${d.theta}); "none" for Poisson counts`,
    `  --site-sd S       SD of the site effects on the log scale (default ${d.siteSd})`,
    `  --change C        annual change to detect, as a fraction (-0.05 = 5% a year fewer; default ${d.annualChange})`,
    `  --alpha A         two-sided test level (default ${d.alpha})`,
    '  --from-fit        take sites, seasons, visits, mean count, theta, site SD and change from a fit of',
    '                    the spec (its time column as a log-linear trend) to --data; options above override',
    '  --replicates N    simulated programmes per cell (default 500)   --seed S (default 1)',
    '  --site-effect E   fixed (default) or random site effects in the refits',
    '  --jobs N          worker threads (default: one per core; 0 = this process)',
    '  --json            print one JSON object {design, cells: [{sites, seasons, power, mcse, ...}], ...}',
    '',
    '  Each simulated programme is refitted (negative binomial, or Poisson with --theta none, with a',
    '  log-linear trend and site effects); power is the share whose slope has p < alpha, with its',
    '  Monte-Carlo standard error. Progress goes to stderr; Ctrl-C stops (exit 130).',
  ].join('\n'),
  async run(argv, io) {
    const args = parseArgs(argv, {
      values: ['sites', 'seasons', 'visits', 'mean-count', 'theta', 'site-sd', 'change', 'alpha', 'replicates', 'seed', 'jobs', 'data', 'spec', 'sheet', 'site-effect'],
      flags: ['json', 'from-fit'],
    });
    let base: PowerDesign = { ...DEFAULT_DESIGN };
    if (args.flags.has('from-fit')) {
      const data = args.options.get('data');
      const specPath = args.options.get('spec');
      if (!data || !specPath) throw new UsageError('--from-fit needs --data FILE and --spec FILE (a spec with "site" and "time").');
      const table = await loadDataTable(resolve(data), { sheet: args.options.get('sheet') });
      base = designFromFit(table, await readSpecFile(resolve(specPath)));
      io.err(`From the fit: ${base.sites} sites, ${base.seasons} seasons, ${base.visits} visit(s), mean count ${fmt(base.meanCount, 3)}, theta ${base.theta === null ? 'none' : fmt(base.theta, 3)}, site SD ${fmt(base.siteSd, 3)}, change ${fmt(100 * base.annualChange, 2)}% a year.`);
    } else if (args.options.has('data') || args.options.has('spec')) {
      throw new UsageError('--data and --spec go with --from-fit.');
    }
    const design: PowerDesign = {
      ...base,
      visits: num(args, 'visits') ?? base.visits,
      meanCount: num(args, 'mean-count') ?? base.meanCount,
      theta: args.options.get('theta')?.trim() === 'none' ? null : (num(args, 'theta') ?? base.theta),
      siteSd: num(args, 'site-sd') ?? base.siteSd,
      annualChange: num(args, 'change') ?? base.annualChange,
      alpha: num(args, 'alpha') ?? base.alpha,
    };
    const grid = { sites: list(args, 'sites') ?? [base.sites], seasons: list(args, 'seasons') ?? [base.seasons] };
    const problem = designProblem({ ...design, sites: Math.min(...grid.sites), seasons: Math.min(...grid.seasons) });
    if (problem) throw new UsageError(problem);
    const effect = args.options.get('site-effect') ?? 'fixed';
    if (effect !== 'fixed' && effect !== 'random') throw new UsageError(`--site-effect takes fixed or random, not "${effect}".`);
    const replicates = num(args, 'replicates') ?? 500;
    const jobs = num(args, 'jobs') ?? defaultJobs();
    const { pool, mode } = createFitPool(jobs);
    io.err(mode === 'threads' ? `Simulating on ${pool.size} worker thread${pool.size > 1 ? 's' : ''}.` : 'Simulating in this process, one fit at a time.');
    let lastTenth = -1;
    try {
      return await interruptible(io, () => 'Stopped: the simulation was interrupted; nothing was printed.', async (signal) => {
        const study = await powerStudy(design, grid, {
          replicates,
          seed: num(args, 'seed') ?? 1,
          siteEffect: effect,
          runner: poolRunner(pool, signal),
          signal,
          onProgress(done, total, stage) {
            const tenth = Math.floor((10 * done) / total);
            if (tenth !== lastTenth) io.err(`${stage}: ${done} of ${total} programmes`);
            lastTenth = tenth;
          },
        });
        if (args.flags.has('json')) io.out(JSON.stringify(withApproximation(study), null, 2));
        else io.out(powerAsText(study));
        return study.cells.some((c) => c.failed > 0) ? 1 : 0;
      });
    } finally {
      pool.dispose();
    }
  },
};

/** For Poisson designs, the analytic Wald power beside each simulated cell. */
function withApproximation(study: PowerStudy): PowerStudy & { cells: (PowerStudy['cells'][number] & { analyticPoisson?: number })[] } {
  if (study.design.theta !== null) return study;
  return { ...study, cells: study.cells.map((c) => ({ ...c, analyticPoisson: poissonTrendPower({ ...study.design, sites: c.sites, seasons: c.seasons }).power })) };
}

function powerAsText(study: PowerStudy): string {
  const s = withApproximation(study);
  const dz = s.design;
  const head = [
    `Power to detect ${fmt(100 * dz.annualChange, 2)}% a year at alpha ${dz.alpha} (two-sided)`,
    `  ${dz.visits} visit(s) per season, mean count ${fmt(dz.meanCount, 3)}, ${dz.theta === null ? 'Poisson counts' : `theta ${fmt(dz.theta, 3)}`}, site SD ${fmt(dz.siteSd, 3)}`,
    `  refitted with a ${s.model}; ${s.replicates} programmes per cell, seed ${s.seed}`,
    '',
  ];
  const poisson = dz.theta === null;
  const header = ['sites', 'seasons', 'power', 'MC s.e.', 'right sign', 'failed', ...(poisson ? ['Wald approx.'] : [])];
  const body = s.cells.map((c) => [String(c.sites), String(c.seasons), fmt(c.power, 3), fmt(c.mcse, 3), fmt(c.powerRightSign, 3), String(c.failed), ...(poisson ? [fmt((c as { analyticPoisson?: number }).analyticPoisson ?? 0, 3)] : [])]);
  return [...head, ...layoutColumns([header, ...body], header.map(() => true)).map((l) => `  ${l}`)].join('\n');
}

function num(args: ParsedArgs, name: string): number | undefined {
  const text = args.options.get(name);
  if (text === undefined) return undefined;
  const v = Number(text.trim());
  if (text.trim() === '' || !Number.isFinite(v)) throw new UsageError(`--${name} takes a number, not "${text}".`);
  return v;
}

function list(args: ParsedArgs, name: string): number[] | undefined {
  const text = args.options.get(name);
  if (text === undefined) return undefined;
  const parts = text.split(',').map((p) => Number(p.trim()));
  if (parts.some((p) => !Number.isInteger(p) || p < 1)) throw new UsageError(`--${name} takes whole numbers separated by commas (e.g. 10,20,40), not "${text}".`);
  return parts;
}
