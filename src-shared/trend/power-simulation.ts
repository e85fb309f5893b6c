/**
 * Power of a monitoring design by simulation: many future programmes are
 * simulated from the design (seeded; each replicate has its own derived
 * stream, so results do not depend on the order fits finish in), each is
 * refitted with a log-linear trend and site effects, and the share whose
 * slope is significant at alpha (two-sided Wald test) estimates the power,
 * with its Monte-Carlo standard error sqrt(p (1 - p) / n).
 */
import type { DataTable } from '../data/table';
import { columnFromNumbers, columnFromTexts } from '../data/table';
import { createRng, deriveSeed } from '../demo/prng';
import { sampleNegBinomial, sampleNormal, samplePoisson } from '../demo/samplers';
import { FitCancelled } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { TrendError } from './errors';
import { inThreadRunner, type FitJob, type FitRunner, type JobResult } from './fit-runner';

/** Replicates simulated and handed to the fitter at a time. */
const POWER_BATCH = 200;
import { designProblem, type PowerDesign } from './power-design';

/** One simulated programme: one row per site, season and visit. */
export function simulateProgramme(d: PowerDesign, seed: number): DataTable {
  const rng = createRng(seed);
  const sites: string[] = [];
  const season: number[] = [];
  const count: number[] = [];
  const q = 1 + d.annualChange;
  for (let i = 0; i < d.sites; i++) {
    const u = d.siteSd > 0 ? sampleNormal(rng, 0, d.siteSd) : 0;
    for (let t = 0; t < d.seasons; t++) {
      const mu = d.meanCount * Math.exp(u) * Math.pow(q, t);
      for (let v = 0; v < d.visits; v++) {
        sites.push(`site${i + 1}`);
        season.push(t + 1);
        count.push(d.theta === null ? samplePoisson(rng, mu) : sampleNegBinomial(rng, mu, d.theta));
      }
    }
  }
  return { nrows: count.length, columns: [columnFromTexts('site', sites), columnFromNumbers('season', season), columnFromNumbers('count', count)] };
}

export type PowerFitModel = 'negbin' | 'poisson';

/** The model each simulated programme is refitted with. */
export function powerSpec(model: PowerFitModel, siteEffect: 'fixed' | 'random'): ModelSpec {
  return {
    response: 'count',
    distribution: model,
    predictors: [{ column: 'season', type: 'numeric' }],
    offsets: [],
    zeroPredictors: [],
    site: { column: 'site', effect: siteEffect, quadraturePoints: 9 },
    time: { column: 'season', trend: 'linear' },
    robust: 'none',
  };
}

export interface PowerCell {
  sites: number;
  seasons: number;
  /** Share of fitted replicates whose slope is significant at alpha. */
  power: number;
  /** Monte-Carlo standard error of `power`. */
  mcse: number;
  /** Share significant and of the simulated sign. */
  powerRightSign: number;
  replicates: number;
  /** Replicates left out because the refit failed or did not converge. */
  failed: number;
}

export interface PowerOptions {
  replicates?: number;
  seed?: number;
  model?: PowerFitModel;
  siteEffect?: 'fixed' | 'random';
  runner?: FitRunner;
  onProgress?: (done: number, total: number, stage: string) => void;
  signal?: { readonly aborted: boolean };
}

export interface PowerStudy {
  design: PowerDesign;
  model: string;
  replicates: number;
  seed: number;
  cells: PowerCell[];
  method: string;
}

/** Power for every combination of numbers of sites and seasons (the other values from `design`). */
export async function powerStudy(design: PowerDesign, grid: { sites: readonly number[]; seasons: readonly number[] }, options: PowerOptions = {}): Promise<PowerStudy> {
  const R = options.replicates ?? 500;
  if (!(Number.isInteger(R) && R >= 10)) throw new TrendError('few-replicates', `A power simulation needs at least 10 replicates (500 or more is usual); ${R} were asked.`);
  const seed = options.seed ?? 1;
  const model = options.model ?? (design.theta === null ? 'poisson' : 'negbin');
  const spec = powerSpec(model, options.siteEffect ?? 'fixed');
  const runner = options.runner ?? inThreadRunner;
  const combos = grid.sites.flatMap((sites) => grid.seasons.map((seasons) => ({ ...design, sites, seasons })));
  for (const c of combos) {
    const problem = designProblem(c);
    if (problem) throw new TrendError('bad-design', problem);
  }
  const total = combos.length * R;
  let before = 0;
  const cells: PowerCell[] = [];
  for (const c of combos) {
    // Simulated and fitted a batch at a time: memory stays bounded whatever R is, and a cancel is
    // seen between batches too. Each replicate's seed is derived from its number, so the batches
    // change nothing in the results.
    const done: JobResult[] = [];
    for (let r0 = 0; r0 < R; r0 += POWER_BATCH) {
      if (options.signal?.aborted) throw new FitCancelled();
      const jobs: FitJob[] = [];
      for (let r = r0; r < Math.min(R, r0 + POWER_BATCH); r++) jobs.push({ table: simulateProgramme(c, deriveSeed(seed, `power ${c.sites}x${c.seasons} #${r}`)), spec });
      const at = before + r0;
      done.push(...(await runner(jobs, { signal: options.signal, onDone: (d) => options.onProgress?.(at + d, total, `${c.sites} sites x ${c.seasons} seasons`) })));
    }
    before += R;
    let hits = 0;
    let right = 0;
    let failed = 0;
    for (const f of done) {
      const row = f.ok && f.outcome.summary.converged ? f.outcome.summary.coefficients.find((x) => x.term === 'season') : undefined;
      if (!row || !Number.isFinite(row.p)) {
        failed++;
        continue;
      }
      if (row.p < c.alpha) {
        hits++;
        if (Math.sign(row.estimate) === Math.sign(Math.log1p(c.annualChange))) right++;
      }
    }
    const n = R - failed;
    if (n === 0) throw new TrendError('power-fits-failed', `None of the ${R} simulated programmes with ${c.sites} sites and ${c.seasons} seasons could be fitted; the counts are probably too sparse. Raise the mean count or the visits.`);
    const p = hits / n;
    cells.push({ sites: c.sites, seasons: c.seasons, power: p, mcse: Math.sqrt((p * (1 - p)) / n), powerRightSign: right / n, replicates: n, failed });
  }
  return {
    design,
    model: `${model} log-linear trend in season with ${options.siteEffect ?? 'fixed'} site effects`,
    replicates: R,
    seed,
    cells,
    method: `share of ${R} simulated programmes per cell whose slope has a two-sided Wald p-value below alpha = ${design.alpha}; Monte-Carlo SE sqrt(p(1-p)/n)`,
  };
}
