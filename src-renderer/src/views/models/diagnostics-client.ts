import { WorkerPool, type RunOptions } from '@shared/worker/pool';
import { webWorker } from '../../worker/web-worker';
import type { ChartRequest, ChartResult } from './diagnostic-charts';
import type { DiagnosticsMethods } from './diagnostics-methods';

/** One diagnostics worker for the page, made on first use; a cancelled call's worker is replaced. */
let pool: WorkerPool<DiagnosticsMethods> | null = null;

export function diagnosticChartsInWorker(req: ChartRequest, options: RunOptions = {}): Promise<ChartResult[]> {
  pool ??= new WorkerPool<DiagnosticsMethods>(() => webWorker(new Worker(new URL('./diagnostics.worker.ts', import.meta.url), { type: 'module', name: 'tallywise-diagnostics' })), { size: 1 });
  return pool.run('charts', [req], options);
}
