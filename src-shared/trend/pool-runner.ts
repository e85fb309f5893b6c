/** Runs trend refits across a worker pool (bootstrap and power simulations on many threads). */
import type { FitMethods } from '../worker/fit-methods';
import type { WorkerPool } from '../worker/pool';
import type { FitRunner, JobResult } from './fit-runner';

/** A runner over the pool; `signal` cancels every call not finished (map then rejects with FitCancelled). */
export function poolRunner(pool: WorkerPool<FitMethods>, signal?: AbortSignal): FitRunner {
  return async (jobs, options = {}) => {
    let done = 0;
    const settled = await pool.map(
      'fit',
      jobs.map((j) => [j.table, j.spec] as const),
      { signal, onResult: () => options.onDone?.(++done, jobs.length) },
    );
    return settled.map((s): JobResult => (s.ok ? { ok: true, outcome: s.value } : { ok: false, message: s.error.message }));
  };
}
