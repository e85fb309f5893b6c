import type { EditLog } from '@shared/cleaning/edit-entry';
import type { LoadedSource } from '@shared/host/contract';
import { cleanedAnalysisOf, type CleanedAnalysis, type SiteSheet } from '@shared/analysis/cleaned-analysis';
import { memoLast } from './memo-last';

/**
 * The Models stage's input: the cleaned records and their analysis table,
 * made by the shared cleanedAnalysisOf (the command line's projectAnalysis
 * runs the same function), remembered between visits to the stage.
 */
export const cleanedAnalysis = memoLast((sources: readonly LoadedSource[] | undefined, log: EditLog | undefined, siteSheet: SiteSheet | null): CleanedAnalysis | null =>
  sources && log ? cleanedAnalysisOf(sources, log, siteSheet) : null,
);
