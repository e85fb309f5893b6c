import type { CallContext } from '@shared/worker/port';
import { diagnosticCharts, type ChartRequest } from './diagnostic-charts';
import { modelOutliers, type OutlierRequest } from './diagnostics-outliers';

/** What the diagnostics worker serves. */
export const diagnosticsMethods = {
  charts: ([req]: readonly [ChartRequest], ctx: CallContext) => diagnosticCharts(req, ctx),
  outliers: ([req]: readonly [OutlierRequest]) => modelOutliers(req),
};

export type DiagnosticsMethods = typeof diagnosticsMethods;
