/**
 * cleanedDataExport: the export tables of a project's cleaned data, the same
 * for the app (built in the page from what the Records stage shows) and the
 * command line (from a saved project, via projectAnalysis):
 * Records, Analysis table, Changes and About.
 */
import type { CleanedAnalysis } from '../analysis/cleaned-analysis';
import type { EditLog } from '../cleaning/edit-entry';
import type { LoadedSource } from '../host/contract';
import { aboutSheet, type ExportOrigin } from './about-sheet';
import { analysisSheet } from './analysis-sheet';
import { changesSheet } from './changes-sheet';
import type { CleanedDataExport } from './export-model';
import { recordPlaces } from './record-places';
import { recordsSheet } from './records-sheet';

export interface ExportInput {
  /** The cleaned analysis (cleanedAnalysisOf) of `sources` with `log`. */
  readonly analysis: CleanedAnalysis;
  readonly sources: readonly LoadedSource[];
  readonly log: EditLog;
  readonly origin: ExportOrigin;
}

/** `onStage` hears each table as it is started (for a progress line). */
export function cleanedDataExport(input: ExportInput, onStage: (stage: string, fraction: number) => void = () => {}): CleanedDataExport {
  const { analysis: a, sources, log, origin } = input;
  const places = recordPlaces(sources);
  const kept = a.cleaned.filter((r) => r.excluded === undefined).length;
  onStage('the records table', 0);
  const records = recordsSheet({ sources, raw: a.raw, cleaned: a.cleaned, log, sites: a.sites, places });
  onStage('the analysis table', 0.6);
  const table = analysisSheet(a.analysis);
  onStage('the change log', 0.9);
  const changes = changesSheet({ log, raw: a.raw, places, conflicts: a.conflicts });
  const about = aboutSheet(origin, {
    sources: sources.map((s) => ({ name: s.summary.fileName, sha256: s.summary.sha256, records: s.summary.records })),
    records: a.cleaned.length,
    kept,
    leftOut: a.cleaned.length - kept,
    analysisRows: a.analysis.table.nrows,
    rule: a.analysis.rule,
    effortColumn: a.analysis.effortColumn,
    changesInEffect: log.cursor,
    changes: log.entries.length,
    siteProblems: a.siteProblems,
  });
  const counts = { records: a.cleaned.length, kept, leftOut: a.cleaned.length - kept, analysisRows: a.analysis.table.nrows };
  return { createdAt: origin.createdAt, title: `${origin.programme}: cleaned data`, counts, sheets: [records, table, changes, about] };
}
