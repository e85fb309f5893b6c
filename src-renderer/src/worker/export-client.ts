import type { CleanedDataExport } from '@shared/export/export-model';
import { WorkerPool } from '@shared/worker/pool';
import type { ExportMethods, ExportRequest } from './export-methods';
import { webWorker } from './web-worker';

/**
 * One export worker for the page, made on first use. Cancelling (the
 * signal) stops the worker at once and the call rejects with FitCancelled;
 * the next export gets a fresh worker.
 */
let pool: WorkerPool<ExportMethods> | null = null;

export function cleanedExportInWorker(req: ExportRequest, options: { signal?: AbortSignal; onProgress?: (fraction: number, stage: string) => void } = {}): Promise<CleanedDataExport> {
  pool ??= new WorkerPool<ExportMethods>(() => webWorker(new Worker(new URL('./export.worker.ts', import.meta.url), { type: 'module', name: 'tallywise-export' })), { size: 1 });
  return pool.run('export', [req], { signal: options.signal, onProgress: options.onProgress });
}
