import type { CallContext } from '@shared/worker/port';
import { diagnosticCharts, type ChartRequest } from './diagnostic-charts';

/** What the diagnostics worker serves. */
export const diagnosticsMethods = {
  charts: ([req]: readonly [ChartRequest], ctx: CallContext) => diagnosticCharts(req, ctx),
};

export type DiagnosticsMethods = typeof diagnosticsMethods;
