/** Runs trend refits across a worker pool (bootstrap and power simulations on many threads). */
import type { GroupStepMethods, GroupStepRunner } from '../report/group-step';
import type { FitMethods } from '../worker/fit-methods';
import type { WorkerPool } from '../worker/pool';
import type { ReplicateMethods, ReplicateOutcome, ReplicateRunner } from './composite-replicate';
import type { FitRunner, JobResult } from './fit-runner';

type ReplicatePool = WorkerPool<FitMethods & ReplicateMethods & GroupStepMethods>;

/** Pools whose workers also serve whole composite replicates and report group steps (servesReplicates). */
const replicatePools = new WeakSet<object>();

/** Marks a pool whose workers serve the replicate and group-step methods as well as the fit methods; returns it. */
export function servesReplicates(pool: ReplicatePool): ReplicatePool {
  replicatePools.add(pool);
  return pool;
}

/**
 * A runner over the pool; `signal` cancels every call not finished (map then
 * rejects with FitCancelled). On a pool marked with servesReplicates the
 * runner also runs whole composite replicates and report group steps in the workers.
 */
export function poolRunner(pool: WorkerPool<FitMethods>, signal?: AbortSignal): FitRunner {
  const fits = async (jobs: Parameters<FitRunner>[0], options: Parameters<FitRunner>[1] = {}): Promise<JobResult[]> => {
    let done = 0;
    const settled = await pool.map(
      'fit',
      jobs.map((j) => [j.table, j.spec] as const),
      { signal, onResult: () => options.onDone?.(++done, jobs.length) },
    );
    return settled.map((s): JobResult => (s.ok ? { ok: true, outcome: s.value } : { ok: false, message: s.error.message }));
  };
  if (!replicatePools.has(pool)) return fits;
  const whole = pool as unknown as ReplicatePool;
  return Object.assign(fits, { replicates: replicateRunner(whole, signal), groupSteps: groupStepRunner(whole, signal) });
}

function groupStepRunner(pool: ReplicatePool, signal?: AbortSignal): GroupStepRunner {
  return (group, options = {}) => pool.run('groupStep', [group], { signal, onProgress: (fraction, stage) => options.onProgress?.(fraction, 1, stage) });
}

function replicateRunner(pool: ReplicatePool, signal?: AbortSignal): ReplicateRunner {
  return async (jobs, options = {}) => {
    let done = 0;
    const per = jobs[0]?.species ?? 0;
    const settled = await pool.map(
      'compositeReplicate',
      jobs.map((j) => [j] as const),
      { signal, onResult: () => options.onDone?.(++done * per, jobs.length * per) },
    );
    return settled.map((s): ReplicateOutcome => (s.ok ? s.value : { ok: false, message: s.error.message }));
  };
}
