import type { DataTable } from '@shared/data/table';
import type { FitOutcome } from '@shared/engine/types';
import type { ModelSpec } from '@shared/model/spec';
import { fitGroupsOnPool, type GroupFitOptions, type GroupResult } from '@shared/worker/fit-batch';
import { planGroups, type Shard } from '@shared/worker/fit-groups';
import type { FitMethods } from '@shared/worker/fit-methods';
import type { WorkerLike } from '@shared/worker/port';
import { defaultPoolSize, WorkerPool, type RunOptions } from '@shared/worker/pool';
import { webWorker } from './web-worker';

/**
 * The page's way to fit: every fit runs in a module worker, never on the UI
 * thread. One pool for the page, made on first use, with one core left for
 * the UI. Cancel with an AbortSignal: a running fit's worker is stopped and
 * replaced, and the call rejects with FitCancelled.
 */

let pool: WorkerPool<FitMethods> | null = null;

function startFitWorker(): WorkerLike {
  return webWorker(new Worker(new URL('./fit.worker.ts', import.meta.url), { type: 'module', name: 'tallywise-fit' }));
}

function fitPool(): WorkerPool<FitMethods> {
  pool ??= new WorkerPool<FitMethods>(startFitWorker, { size: defaultPoolSize(navigator.hardwareConcurrency || 2, 1) });
  return pool;
}

/** Fits one spec to one table in a worker. */
export function fitInWorker(table: DataTable, spec: ModelSpec, options: RunOptions = {}): Promise<FitOutcome> {
  return fitPool().run('fit', [table, spec], options);
}

/**
 * Fits the same spec to each group of a column (e.g. each species) across
 * the workers; `onResult` gets each group as it finishes. Rows with a blank
 * cell in the column belong to no group and are not fitted.
 */
export function fitGroupsInWorkers(table: DataTable, spec: ModelSpec, byColumn: string, options: GroupFitOptions & { shard?: Shard } = {}): Promise<GroupResult[]> {
  const plan = planGroups(table, byColumn, options.shard);
  return fitGroupsOnPool(fitPool(), plan.jobs, spec, options);
}

/** Stops every fit worker (e.g. when the project is closed); the next fit starts new ones. */
export function stopFitWorkers(): void {
  pool?.dispose();
  pool = null;
}
