import { WorkerPool, type RunOptions } from '@shared/worker/pool';
import { webWorker } from '../../worker/web-worker';
import type { ChartRequest, ChartResult } from './diagnostic-charts';
import type { DiagnosticsMethods } from './diagnostics-methods';
import type { OutlierRequest, OutlierResult } from './diagnostics-outliers';

/** One diagnostics worker for the page, made on first use; a cancelled call's worker is replaced. */
let pool: WorkerPool<DiagnosticsMethods> | null = null;

function diagnosticsPool(): WorkerPool<DiagnosticsMethods> {
  pool ??= new WorkerPool<DiagnosticsMethods>(() => webWorker(new Worker(new URL('./diagnostics.worker.ts', import.meta.url), { type: 'module', name: 'tallywise-diagnostics' })), { size: 1 });
  return pool;
}

export function diagnosticChartsInWorker(req: ChartRequest, options: RunOptions = {}): Promise<ChartResult[]> {
  return diagnosticsPool().run('charts', [req], options);
}

export function modelOutliersInWorker(req: OutlierRequest, options: RunOptions = {}): Promise<OutlierResult> {
  return diagnosticsPool().run('outliers', [req], options);
}
