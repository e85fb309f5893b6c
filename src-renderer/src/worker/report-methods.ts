import type { CallContext } from '@shared/worker/port';
import { buildProgrammeReport, type ProgrammePlan, type ProgrammeProgress } from '@shared/report/programme-report';

/**
 * What the report worker serves: the whole programme's report run. Progress
 * crosses as the context's (fraction, stage) pair: the overall fraction, and
 * the full progress record as JSON in the stage (see readProgress).
 */
export const reportMethods = {
  report: ([plan]: readonly [ProgrammePlan], ctx: CallContext) =>
    buildProgrammeReport(plan, {
      signal: ctx.signal,
      onProgress: (p) => ctx.onProgress(Math.min(1, (p.done + p.fraction) / Math.max(1, p.total)), JSON.stringify(p)),
    }),
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
