import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { fileURLToPath } from 'node:url';
import { servesReplicates } from '@shared/trend/pool-runner';
import { localWorker } from '@shared/worker/local-worker';
import { defaultPoolSize, WorkerPool } from '@shared/worker/pool';
import { reportFitMethods, type ReportFitMethods } from '@shared/report/fit-worker-methods';
import { nodeWorker } from './node-worker';

/** Where the built worker is: beside the bundle, or (running from source) in the repository's build output. */
export function fitWorkerFile(): string | null {
  const candidates = [new URL('./fit-worker.mjs', import.meta.url), new URL('../../../out/cli/fit-worker.mjs', import.meta.url)];
  for (const url of candidates) {
    if (url.protocol !== 'file:') continue;
    const path = fileURLToPath(url);
    if (existsSync(path)) return path;
  }
  return null;
}

/** Worker threads by default: one per core (this thread only waits). */
export function defaultJobs(): number {
  return defaultPoolSize(availableParallelism(), 0);
}

export interface FitPool {
  pool: WorkerPool<ReportFitMethods>;
  /** 'threads' with worker threads, 'in-process' when the fits run in this thread one at a time. */
  mode: 'threads' | 'in-process';
}

/** A pool of `jobs` fit worker threads; `jobs` 0, or no built worker, fits in this thread. */
export function createFitPool(jobs: number): FitPool {
  const file = jobs > 0 ? fitWorkerFile() : null;
  if (file) return { pool: servesReplicates(new WorkerPool<ReportFitMethods>(() => nodeWorker(file), { size: jobs })), mode: 'threads' };
  return { pool: servesReplicates(new WorkerPool<ReportFitMethods>(() => localWorker(reportFitMethods), { size: 1 })), mode: 'in-process' };
}
