/**
 * projectAnalysis(doc): the analysis table of a project as the app's Models
 * stage sees it, computed in Node from the project file alone (for the
 * command line and report runs).
 *
 *   import { projectAnalysis } from '../project/project-analysis';
 *   const a = await projectAnalysis(doc);
 *   a.table     DataTable, one row per site x season x species: site, season,
 *               species, count, visits, effort in its canonical unit
 *               (a.roles.effort: effort_h, effort_km ...), log_effort,
 *               area_ha and log_area (when the site list gives areas),
 *               offset, at_least_records, approximate_records,
 *               present_uncounted, then the site covariates (a.roles.covariates),
 *               then the visit covariates (a.analysis.visitCovariates: each
 *               one's column, kind and how many rows were left blank)
 *   a.roles     { site, season, species, count, effort, area, covariates }: column names
 *   a.analysis  the AnalysisTable (table + which records made each row + what was left out)
 *   a.cleaned   the cleaned records (raw + log); a.raw the raw ones; a.conflicts
 *               log entries that no longer fit the records
 *   a.log       the edit log (doc.cleaning)
 *   a.sources   [{ id, name, sha256, rows }] (rows = records read from the source)
 *   a.dataKey   the same key the app stores in doc.fitCache: a model whose
 *               fitCache key differs was fitted to other data
 *   a.siteProblems  what was wrong with the site list (messages for the user)
 *
 * The import is redone from the stored cells (rebuildSource), the cleaning
 * log replayed and the site list joined by src-shared/analysis, the very
 * code the renderer runs, so app and command line see the same table.
 */
import type { ProjectDocument } from '@shared/project/document';
import type { EditLog } from '@shared/cleaning/edit-entry';
import type { LoadedSource } from '@shared/host/contract';
import { cleanedAnalysisOf, type CleanedAnalysis, type SiteSheet } from '@shared/analysis/cleaned-analysis';
import type { DataTable } from '@shared/data/table';
import { rebuildSource } from '../services/record-import';
import { storedMappings } from './stored-mappings';

export interface ProjectAnalysis extends CleanedAnalysis {
  readonly table: DataTable;
  readonly log: EditLog;
  readonly sources: readonly { id: string; name: string; sha256: string; rows: number }[];
  /** The sources as the app loads them (records and import findings). */
  readonly loaded: readonly LoadedSource[];
}

/** The site list the document links, with its stored cells (null cells when the source or sheet is missing). */
export function siteSheetOf(doc: ProjectDocument): SiteSheet | null {
  const link = doc.sites;
  if (!link) return null;
  const source = doc.sources.find((s) => s.id === link.sourceId);
  return { link, grid: source?.sheets.find((g) => g.name === link.sheet) ?? null, fileName: source?.fileName ?? `source ${link.sourceId}` };
}

export async function projectAnalysis(doc: ProjectDocument): Promise<ProjectAnalysis> {
  const mappings = storedMappings(doc.mapping);
  const loaded = doc.sources.map((s) => rebuildSource(s, mappings.get(s.id)));
  const result = cleanedAnalysisOf(loaded, doc.cleaning, siteSheetOf(doc));
  return {
    ...result,
    table: result.analysis.table,
    log: doc.cleaning,
    sources: loaded.map((s) => ({ id: s.summary.id, name: s.summary.fileName, sha256: s.summary.sha256, rows: s.summary.records })),
    loaded,
  };
}
