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
import { splitBy } from '../data/table';
import { createRng } from '../demo/prng';
import { FitCancelled } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import { TrendError } from './errors';
import { checkFinite } from './finite-check';
import { inThreadRunner, type FitJob, type FitRunner } from './fit-runner';
import { annualLogIndices, indexRows, type LogIndices } from './indices';
import type { IndexRow } from './interval';
import { percentileLimits } from './percentile';
import { resampleSites, rowsBySite } from './resample-sites';
import { annualTrendSpec } from './trend-specs';

/** Weighted mean of log indices over species that share the seasons; weights default to 1. */
export function compositeLog(species: readonly { key: string; log: LogIndices }[], weights: Readonly<Record<string, number>> = {}): Float64Array {
  if (species.length === 0) throw new TrendError('no-species', 'A composite index needs at least one species.');
  const levels = species[0].log.time.levels;
  const out = new Float64Array(levels.length);
  let total = 0;
  for (const s of species) {
    const w = weights[s.key] ?? 1;
    if (!(w >= 0 && Number.isFinite(w))) throw new TrendError('bad-weight', `The weight of "${s.key}" must be a number of at least 0, not ${w}.`);
    total += w;
    levels.forEach((l, i) => {
      const j = s.log.time.levels.indexOf(l);
      if (j < 0) throw new TrendError('species-missing-season', `The species "${s.key}" has no rows in season ${l}, so it cannot enter a composite over that season. Leave the species out or restrict the seasons.`);
      out[i] += w * s.log.log[j];
    });
  }
  if (!(total > 0)) throw new TrendError('bad-weight', 'The species weights add up to 0; give at least one species a positive weight.');
  for (let i = 0; i < out.length; i++) out[i] /= total;
  return out;
}

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

function groupFits(table: DataTable, by: string, specOf: (key: string) => ModelSpec): { keys: string[]; jobs: FitJob[]; tables: DataTable[] } {
  const groups = splitBy(table, by).filter((g) => g.key !== '');
  return { keys: groups.map((g) => g.key), tables: groups.map((g) => g.table), jobs: groups.map((g) => ({ table: g.table, spec: specOf(g.key) })) };
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
  const species = fitted.map((f, i) => {
    if (!f.ok) throw new TrendError('species-fit-failed', `The trend for ${by} "${point.keys[i]}" could not be fitted: ${f.message}`);
    return { key: point.keys[i], log: annualLogIndices(point.tables[i], annual(point.keys[i]), f.outcome, options.base) };
  });
  const base = species[0].log.base;
  const weights = Object.fromEntries(species.map((s) => [s.key, options.weights?.[s.key] ?? 1]));
  const unknown = Object.keys(options.weights ?? {}).filter((k) => !point.keys.includes(k));
  if (unknown.length) throw new TrendError('bad-weight', `Weights were given for ${unknown.map((k) => `"${k}"`).join(', ')}, which ${unknown.length > 1 ? 'are not values' : 'is not a value'} of "${by}" (its values are ${point.keys.join(', ')}).`);
  const comp = compositeLog(species, weights);
  const rng = createRng(options.seed ?? 1);
  const groups = rowsBySite(table, site);
  const jobs: FitJob[] = [];
  const reps: { keys: string[]; tables: DataTable[] }[] = [];
  for (let r = 0; r < R; r++) {
    const g = groupFits(resampleSites(table, site, groups, rng), by, annual);
    reps.push(g);
    jobs.push(...g.jobs);
  }
  const done = await runner(jobs, { signal: options.signal, onDone: (d, n) => progress(d, n, 'bootstrap refits') });
  if (options.signal?.aborted) throw new FitCancelled();
  const L = comp.length;
  const draws: number[][] = Array.from({ length: L }, () => []);
  let failed = 0;
  let at = 0;
  for (const rep of reps) {
    const results = done.slice(at, at + rep.keys.length);
    at += rep.keys.length;
    try {
      if (rep.keys.length !== point.keys.length) throw new Error('a species is missing');
      const sp = results.map((f, i) => {
        if (!f.ok || !f.outcome.summary.converged) throw new Error('not fitted');
        return { key: rep.keys[i], log: annualLogIndices(rep.tables[i], annual(rep.keys[i]), f.outcome, base) };
      });
      const c = compositeLog(sp, weights);
      species[0].log.time.levels.forEach((l, i) => draws[i].push(c[sp[0].log.time.levels.indexOf(l)]));
    } catch {
      failed++;
    }
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
