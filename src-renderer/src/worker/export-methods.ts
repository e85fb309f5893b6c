import { cleanedAnalysisOf, type SiteSheet } from '@shared/analysis/cleaned-analysis';
import type { EditLog } from '@shared/cleaning/edit-entry';
import type { ExportOrigin } from '@shared/export/about-sheet';
import { cleanedDataExport } from '@shared/export/build-export';
import type { LoadedSource } from '@shared/host/contract';
import type { CallContext } from '@shared/worker/port';

/** What the page sends to build the cleaned-data export: the project's sources, its change log and site list, and where it came from. */
export interface ExportRequest {
  readonly sources: readonly LoadedSource[];
  readonly log: EditLog;
  readonly siteSheet: SiteSheet | null;
  readonly origin: ExportOrigin;
}

/**
 * What the export worker serves: the cleaning replayed and the export tables
 * built (src-shared/export), off the UI thread, with a progress stage per table.
 */
export const exportMethods = {
  export: ([req]: readonly [ExportRequest], ctx: CallContext) => {
    ctx.onProgress(0, 'replaying the cleaning');
    const analysis = cleanedAnalysisOf(req.sources, req.log, req.siteSheet);
    return cleanedDataExport({ analysis, sources: req.sources, log: req.log, origin: req.origin }, (stage, fraction) => ctx.onProgress(0.3 + 0.7 * fraction, stage));
  },
};

export type ExportMethods = typeof exportMethods;
