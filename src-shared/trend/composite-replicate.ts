/**
 * One replicate of the composite index's site-block bootstrap as one job:
 * the drawn sites' table, a fit of every species in it, and the composite
 * log index per season of the full-data fit. A worker runs the whole
 * replicate and sends back one short array, so the calling thread neither
 * builds the resampled tables nor receives whole fits. The same job also
 * runs in this thread, or as separate fits on any FitRunner.
 */
import type { DataTable } from '../data/table';
import { splitBy } from '../data/table';
import { fitModel } from '../engine/fit';
import { FitCancelled, type FitControl, type FitStart } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import type { CallContext } from '../worker/port';
import type { FitJob, FitRunner, JobResult, RunOptions } from './fit-runner';
import { annualLogIndices } from './indices';
import { compositeLog } from './composite-log';
import { startOfDraws } from './refit-start';
import { tableOfSites } from './resample-sites';

export interface ReplicateJob {
  /** The rows of every species, with the group and site columns. */
  readonly table: DataTable;
  readonly site: string;
  readonly by: string;
  /** rowsBySite(table, site), the same for every replicate. */
  readonly groups: { readonly sites: string[]; readonly rows: number[][] };
  /** The drawn sites (drawSites). */
  readonly picks: readonly number[];
  /** The annual spec of each species; species without one use `common`. */
  readonly specs: Readonly<Record<string, ModelSpec>>;
  readonly common: ModelSpec;
  /** How many species the full data has: a replicate missing one fails. */
  readonly species: number;
  readonly weights: Readonly<Record<string, number>>;
  /** The composite's base season and its seasons (those of the first species' full-data fit). */
  readonly base: string;
  readonly levels: readonly string[];
  /** Starts of each species' refits from its full-data fit (startOfFit); species without one start from scratch. */
  readonly starts?: Readonly<Record<string, FitStart>>;
}

/** The composite log index per season of `levels`, or why the replicate is left out. */
export type ReplicateOutcome = { ok: true; values: number[] } | { ok: false; message: string };

/** Runs replicate jobs; `onDone` counts species refits (each replicate is `species` of them). */
export type ReplicateRunner = (jobs: readonly ReplicateJob[], options?: RunOptions) => Promise<ReplicateOutcome[]>;

/** The groups of a table (blank group cells left out), each with its fit job. */
export function groupFits(table: DataTable, by: string, specOf: (key: string) => ModelSpec): { keys: string[]; jobs: FitJob[]; tables: DataTable[] } {
  const groups = splitBy(table, by).filter((g) => g.key !== '');
  return { keys: groups.map((g) => g.key), tables: groups.map((g) => g.table), jobs: groups.map((g) => ({ table: g.table, spec: specOf(g.key) })) };
}

function replicateFits(job: ReplicateJob): { keys: string[]; jobs: FitJob[]; tables: DataTable[] } {
  return groupFits(tableOfSites(job.table, job.site, job.groups, job.picks), job.by, (key) => job.specs[key] ?? job.common);
}

function replicateValues(job: ReplicateJob, fits: { keys: string[]; jobs: FitJob[]; tables: DataTable[] }, results: readonly JobResult[]): ReplicateOutcome {
  try {
    if (fits.keys.length !== job.species) throw new Error('a species is missing');
    const sp = results.map((f, i) => {
      if (!f.ok || !f.outcome.summary.converged) throw new Error('not fitted');
      return { key: fits.keys[i], log: annualLogIndices(fits.tables[i], fits.jobs[i].spec, f.outcome, job.base, { se: false }) };
    });
    const c = compositeLog(sp, job.weights);
    return { ok: true, values: job.levels.map((l) => c[sp[0].log.time.levels.indexOf(l)]) };
  } catch (err) {
    return { ok: false, message: (err as Error).message };
  }
}

/**
 * The whole replicate in this thread (what a worker runs); cancelling throws
 * FitCancelled. The refits skip their inference (`control.inference`,
 * default 'none': the bootstrap reads only estimates and convergence) and
 * start from the full-data fits in `job.starts`.
 */
export function compositeReplicate(job: ReplicateJob, control: FitControl = {}): ReplicateOutcome {
  const fits = replicateFits(job);
  const results = fits.jobs.map((j, i): JobResult => {
    const start = job.starts?.[fits.keys[i]];
    const refit: FitControl = { signal: control.signal, inference: control.inference ?? 'none', ...(start ? { start: startOfDraws(start, job.groups, job.picks) } : {}) };
    try {
      return { ok: true, outcome: fitModel(j.table, j.spec, refit) };
    } catch (err) {
      if (err instanceof FitCancelled) throw err;
      return { ok: false, message: (err as Error).message };
    }
  });
  return replicateValues(job, fits, results);
}

/** What a worker serves for the composite bootstrap. */
export const replicateMethods = {
  compositeReplicate: ([job]: readonly [ReplicateJob], ctx: CallContext): ReplicateOutcome => compositeReplicate(job, ctx),
};

export type ReplicateMethods = typeof replicateMethods;

/** Replicates one after another in this thread. */
export const inThreadReplicates: ReplicateRunner = async (jobs, options = {}) => {
  const out: ReplicateOutcome[] = [];
  for (const job of jobs) {
    if (options.signal?.aborted) throw new FitCancelled();
    out.push(compositeReplicate(job, { signal: options.signal }));
    options.onDone?.(out.length * job.species, jobs.length * job.species);
  }
  return out;
};

/** Replicates as separate fits on a FitRunner (one that cannot run whole replicates). */
export function replicatesOverFits(runner: FitRunner): ReplicateRunner {
  return async (jobs, options = {}) => {
    const fits = jobs.map(replicateFits);
    const done = await runner(fits.flatMap((f) => f.jobs), options);
    let at = 0;
    return jobs.map((job, r) => {
      const results = done.slice(at, at + fits[r].jobs.length);
      at += fits[r].jobs.length;
      return replicateValues(job, fits[r], results);
    });
  };
}
