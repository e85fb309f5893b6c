import type { CallContext } from '@shared/worker/port';
import type { ReportFitMethods } from '@shared/report/fit-worker-methods';
import { runProgrammeReport, type ProgrammePlan, type ProgrammeProgress } from '@shared/report/programme-report';
import { poolRunner, servesReplicates } from '@shared/trend/pool-runner';
import { defaultPoolSize, WorkerPool } from '@shared/worker/pool';
import { webWorker } from './web-worker';

/**
 * The report worker's own fit workers (one per core: the page waits on the
 * report, which shows its progress), made on first use; none where this
 * scope cannot start workers (the report then runs in this worker alone).
 * They end with the report worker (cancelling a report stops it).
 */
let fitPool: WorkerPool<ReportFitMethods> | null = null;

function reportFitPool(): WorkerPool<ReportFitMethods> | null {
  if (typeof Worker === 'undefined') return null;
  fitPool ??= servesReplicates(
    new WorkerPool<ReportFitMethods>(() => webWorker(new Worker(new URL('./report-fit.worker.ts', import.meta.url), { type: 'module', name: 'tallywise-report-fit' })), {
      size: defaultPoolSize(navigator.hardwareConcurrency || 2, 0),
    }),
  );
  return fitPool;
}

/**
 * What the report worker serves: the whole programme's report run (the
 * document, the run's report-history record and how it compares with the
 * last report). Progress
 * crosses as the context's (fraction, stage) pair: the overall fraction, and
 * the full progress record as JSON in the stage (see readProgress).
 */
export const reportMethods = {
  report: ([plan]: readonly [ProgrammePlan], ctx: CallContext) => {
    const pool = reportFitPool();
    return runProgrammeReport(plan, {
      signal: ctx.signal,
      runner: pool ? poolRunner(pool) : undefined,
      onProgress: (p) => ctx.onProgress(Math.min(1, (p.done + p.fraction) / Math.max(1, p.total)), JSON.stringify(p)),
    });
  },
};

export type ReportMethods = typeof reportMethods;

/** The progress record a report worker sent, or null for anything else. */
export function readProgress(stage: string): ProgrammeProgress | null {
  try {
    const p = JSON.parse(stage) as Partial<ProgrammeProgress>;
    return typeof p.group === 'string' && typeof p.done === 'number' && typeof p.total === 'number' && typeof p.fraction === 'number' && typeof p.stage === 'string' ? (p as ProgrammeProgress) : null;
  } catch {
    return null;
  }
}
