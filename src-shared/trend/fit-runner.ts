/**
 * How many fits are run: a function from jobs to outcomes (or the error of
 * each job that failed), so the bootstrap and the power simulation run the
 * same way in this thread (tests, the app's worker) and across a pool of
 * worker threads (the command line).
 */
import type { DataTable } from '../data/table';
import { fitModel } from '../engine/fit';
import { FitCancelled, type FitOutcome } from '../engine/types';
import type { ModelSpec } from '../model/spec';
import type { GroupStepRunner } from '../report/group-step';
import type { ReplicateRunner } from './composite-replicate';

export interface FitJob {
  readonly table: DataTable;
  readonly spec: ModelSpec;
}

export type JobResult = { ok: true; outcome: FitOutcome } | { ok: false; message: string };

export interface RunOptions {
  /** Called as each job finishes (done of total). */
  onDone?: (done: number, total: number) => void;
  signal?: { readonly aborted: boolean };
}

/**
 * Where given, `replicates` runs whole composite bootstrap replicates (resampling and fits) and
 * `groupSteps` whole report group steps where the fits run (a worker pool), so little crosses over.
 */
export type FitRunner = ((jobs: readonly FitJob[], options?: RunOptions) => Promise<JobResult[]>) & {
  readonly replicates?: ReplicateRunner;
  readonly groupSteps?: GroupStepRunner;
};

/** Runs the jobs one after another in this thread; throws FitCancelled when the signal is raised. */
export const inThreadRunner: FitRunner = async (jobs, options = {}) => {
  const out: JobResult[] = [];
  for (const job of jobs) {
    if (options.signal?.aborted) throw new FitCancelled();
    try {
      out.push({ ok: true, outcome: fitModel(job.table, job.spec, { signal: options.signal }) });
    } catch (err) {
      if (err instanceof FitCancelled) throw err;
      out.push({ ok: false, message: (err as Error).message });
    }
    options.onDone?.(out.length, jobs.length);
  }
  return out;
};
