import { applyLog, type LogConflict } from '../cleaning/apply-log';
import type { EditLog } from '../cleaning/edit-entry';
import type { CleaningRecord } from '../cleaning/record';
import type { LoadedSource } from '../host/contract';
import type { AnalysisTable } from '../import/aggregate';
import type { SheetGrid } from '../project/sheet-grid';
import type { SiteSheetLink } from '../project/site-sheet-link';
import { analysisTableOf } from './analysis-table';
import { dataKey } from './data-key';
import { commonEffortUnit, rawRecordsOf, visitCovariatesOf } from './loaded-records';
import { siteAttributesFromSheet, SiteSheetError, type SiteAttributes } from './site-attributes';

/**
 * The whole way from the imported sources to the analysis table, the same
 * for the app (Models stage) and the command line (project-analysis.ts):
 * raw records -> cleaning log replayed -> site list joined -> aggregated
 * (visit covariates combined over each row's visits; their columns are
 * listed in `analysis.visitCovariates`).
 */
export interface SiteSheet {
  readonly link: SiteSheetLink;
  /** The linked sheet's stored cells; null when the source or sheet is not in the project. */
  readonly grid: SheetGrid | null;
  readonly fileName: string;
}

/** Which column of the analysis table plays which part. */
export interface AnalysisRoles {
  readonly site: 'site';
  readonly season: 'season';
  readonly species: 'species';
  readonly count: 'count';
  /** Effort in its canonical unit (effort_h, effort_km ...), when the records have effort. */
  readonly effort: string | null;
  readonly area: 'area_ha' | null;
  /** Site covariates from the site list. */
  readonly covariates: readonly string[];
}

export interface CleanedAnalysis {
  readonly raw: readonly CleaningRecord[];
  /** Raw records with the log replayed (excluded ones carry their reason). */
  readonly cleaned: readonly CleaningRecord[];
  readonly conflicts: readonly LogConflict[];
  readonly effortUnit: string | undefined;
  readonly analysis: AnalysisTable;
  readonly roles: AnalysisRoles;
  readonly sites: SiteAttributes | null;
  /** What was wrong with the site list, each naming the place and the fix. */
  readonly siteProblems: readonly string[];
  readonly dataKey: string;
}

function readSites(sheet: SiteSheet | null): { sites: SiteAttributes | null; covariates?: readonly string[]; problems: string[] } {
  if (!sheet) return { sites: null, problems: [] };
  if (!sheet.grid) return { sites: null, problems: [`The site list is linked to sheet "${sheet.link.sheet}" of ${sheet.fileName}, which the project does not hold; link the site list again.`] };
  try {
    const r = siteAttributesFromSheet(sheet.grid, sheet.link, sheet.fileName);
    return { sites: r.sites, covariates: r.covariates, problems: [...r.problems] };
  } catch (err) {
    if (err instanceof SiteSheetError) return { sites: null, problems: [err.message] };
    throw err;
  }
}

export function cleanedAnalysisOf(sources: readonly LoadedSource[], log: EditLog, siteSheet: SiteSheet | null): CleanedAnalysis {
  const raw = rawRecordsOf(sources);
  const { records: cleaned, conflicts } = applyLog(raw, log);
  const effortUnit = commonEffortUnit(sources);
  const { sites, covariates, problems } = readSites(siteSheet);
  const analysis = analysisTableOf(cleaned, effortUnit, sites, covariates, visitCovariatesOf(sources));
  const has = (name: string) => analysis.table.columns.some((c) => c.name === name);
  const roles: AnalysisRoles = {
    site: 'site',
    season: 'season',
    species: 'species',
    count: 'count',
    effort: analysis.effortColumn ?? null,
    area: has('area_ha') ? 'area_ha' : null,
    covariates: (covariates ?? []).filter(has),
  };
  const key = dataKey(sources.map((s) => s.summary.id), log, siteSheet?.link ?? null);
  return { raw, cleaned, conflicts, effortUnit, analysis, roles, sites, siteProblems: problems, dataKey: key };
}
