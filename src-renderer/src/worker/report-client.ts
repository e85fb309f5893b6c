import type { ProgrammePlan, ProgrammeProgress, ProgrammeRun } from '@shared/report/programme-report';
import { WorkerPool } from '@shared/worker/pool';
import { readProgress, type ReportMethods } from './report-methods';
import { webWorker } from './web-worker';

/**
 * One report worker for the page, made on first use. Cancelling (the
 * signal) stops the worker at once and the call rejects with FitCancelled;
 * the next report gets a fresh worker.
 */
let pool: WorkerPool<ReportMethods> | null = null;

export function programmeReportInWorker(plan: ProgrammePlan, options: { signal?: AbortSignal; onProgress?: (p: ProgrammeProgress) => void } = {}): Promise<ProgrammeRun> {
  pool ??= new WorkerPool<ReportMethods>(() => webWorker(new Worker(new URL('./report.worker.ts', import.meta.url), { type: 'module', name: 'tallywise-report' })), { size: 1 });
  return pool.run('report', [plan], {
    signal: options.signal,
    onProgress: (_fraction, stage) => {
      const p = readProgress(stage);
      if (p) options.onProgress?.(p);
    },
  });
}
