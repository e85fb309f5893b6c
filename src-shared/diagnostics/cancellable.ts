/** Progress and cancellation for the longer diagnostics (simulation envelopes, refits), as the engine does it. */
import type { FitControl } from '../engine/types';
import { FitCancelled } from '../engine/types';

export type DiagnosticsControl = Pick<FitControl, 'onProgress' | 'signal'>;

/** Throws FitCancelled when the caller has aborted. */
export function checkCancelled(control: DiagnosticsControl | undefined): void {
  if (control?.signal?.aborted) throw new FitCancelled();
}

export function reportProgress(control: DiagnosticsControl | undefined, fraction: number, stage: string): void {
  control?.onProgress?.(Math.min(1, Math.max(0, fraction)), stage);
}
