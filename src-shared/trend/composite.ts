/**
 * A multi-species composite index: the (weighted) geometric mean of the
 * species' annual indices, i.e. the weighted mean of their log indices
 * against a common base season, with site-block bootstrap percentile limits
 * (sites resampled once per replicate for all species together, so the
 * species' shared site-to-site variation is kept). The method follows
 * Buckland, S.T., Magurran, A.E., Green, R.E. & Fewster, R.M. (2005)
 * Monitoring change in biodiversity through composite indices. Phil. Trans.
 * R. Soc. B 360:243-254, and Gregory, R.D. et al. (2005) Developing
 * indicators for European birds. Phil. Trans. R. Soc. B 360:269-288.
 */
import type { DataTable } from '../data/table';
import { createRng } from '../demo/prng';
import { FitCancelled, type FitStart } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { compositeLog } from './composite-log';
import { groupFits, inThreadReplicates, replicatesOverFits, type ReplicateJob } from './composite-replicate';
import { TrendError } from './errors';
import { checkFinite } from './finite-check';
import { inThreadRunner, type FitRunner } from './fit-runner';
import { annualLogIndices, indexRows } from './indices';
import type { IndexRow } from './interval';
import { percentileLimits } from './percentile';
import { startOfFit } from './refit-start';
import { drawSites, rowsBySite } from './resample-sites';
import { annualTrendSpec } from './trend-specs';

export { compositeLog } from './composite-log';

export interface CompositeOptions {
  base?: number | string;
  weights?: Readonly<Record<string, number>>;
  replicates?: number;
  seed?: number;
  runner?: FitRunner;
  onProgress?: (done: number, total: number, stage: string) => void;
  signal?: { readonly aborted: boolean };
  /** A spec of its own for some groups (the model chosen for that species); the others use the common spec. */
  specs?: Readonly<Record<string, ModelSpec>>;
}

export interface CompositeResult {
  species: { group: string; indices: IndexRow[] }[];
  composite: { indices: IndexRow[]; weights: Record<string, number>; replicates: number; failedReplicates: number; seed: number; method: string };
}

export async function compositeTrend(table: DataTable, spec: ModelSpec, by: string, options: CompositeOptions = {}): Promise<CompositeResult> {
  const site = spec.site?.column;
  if (!site) throw new TrendError('bootstrap-needs-site', 'Composite limits resample whole sites: add "site" to the model spec.');
  const base0 = options.base ?? spec.time?.base;
  const common = annualTrendSpec(spec, base0);
  const own = Object.fromEntries(Object.entries(options.specs ?? {}).map(([k, s]) => [k, annualTrendSpec(s, base0)]));
  const annual = (key: string) => own[key] ?? common;
  const runner = options.runner ?? inThreadRunner;
  const progress = options.onProgress ?? (() => {});
  const R = options.replicates ?? 199;
  if (!(Number.isInteger(R) && R >= 20)) throw new TrendError('few-replicates', `Composite limits need at least 20 bootstrap replicates (199 or more is usual); ${R} were asked.`);
  const point = groupFits(table, by, annual);
  progress(0, 1, 'fitting each species');
  const fitted = await runner(point.jobs, { signal: options.signal });
  // The refits of the bootstrap start from these fits.
  const starts: Record<string, FitStart> = {};
  const species = fitted.map((f, i) => {
    if (!f.ok) throw new TrendError('species-fit-failed', `The trend for ${by} "${point.keys[i]}" could not be fitted: ${f.message}`);
    starts[point.keys[i]] = startOfFit(f.outcome);
    return { key: point.keys[i], log: annualLogIndices(point.tables[i], annual(point.keys[i]), f.outcome, options.base) };
  });
  const base = species[0].log.base;
  const weights = Object.fromEntries(species.map((s) => [s.key, options.weights?.[s.key] ?? 1]));
  const unknown = Object.keys(options.weights ?? {}).filter((k) => !point.keys.includes(k));
  if (unknown.length) throw new TrendError('bad-weight', `Weights were given for ${unknown.map((k) => `"${k}"`).join(', ')}, which ${unknown.length > 1 ? 'are not values' : 'is not a value'} of "${by}" (its values are ${point.keys.join(', ')}).`);
  const comp = compositeLog(species, weights);
  const rng = createRng(options.seed ?? 1);
  const groups = rowsBySite(table, site);
  const levels = species[0].log.time.levels;
  const jobs: ReplicateJob[] = [];
  for (let r = 0; r < R; r++) {
    jobs.push({ table, site, by, groups, picks: drawSites(groups, rng), specs: own, common, species: point.keys.length, weights, base, levels, starts });
  }
  const replicates = runner.replicates ?? (options.runner ? replicatesOverFits(runner) : inThreadReplicates);
  const done = await replicates(jobs, { signal: options.signal, onDone: (d, n) => progress(d, n, 'bootstrap refits') });
  if (options.signal?.aborted) throw new FitCancelled();
  const draws: number[][] = levels.map(() => []);
  let failed = 0;
  for (const rep of done) {
    if (rep.ok) rep.values.forEach((v, i) => draws[i].push(v));
    else failed++;
  }
  if (R - failed < 20) throw new TrendError('bootstrap-failed', `Only ${R - failed} of ${R} bootstrap replicates could be fitted for every species, too few for limits.`);
  const rows = species[0].log.time.levels.map((l, i): IndexRow => {
    const p = percentileLimits(draws[i]);
    const isBase = l === base;
    return { time: species[0].log.time.values[i], index: 100 * Math.exp(comp[i]), lower: isBase ? 100 : 100 * Math.exp(p.lower), upper: isBase ? 100 : 100 * Math.exp(p.upper) };
  });
  checkFinite('composite index', rows);
  return {
    species: species.map((s) => ({ group: s.key, indices: indexRows(s.log) })),
    composite: {
      indices: rows,
      weights,
      replicates: R,
      failedReplicates: failed,
      seed: options.seed ?? 1,
      method: `weighted geometric mean of the species' annual indices (Buckland et al. 2005; Gregory et al. 2005); site-block bootstrap percentile limits, sites of "${site}" resampled jointly for all species`,
    },
  };
}
