/**
 * The demo project (invented, simulated) as the app's Records stage holds it,
 * with one more cell edit, and its cleaned-data export: shared by the export
 * tests. The edit raises one counted record by 7, so it shows in Records
 * (count used), in the analysis table (its row's sum) and in Changes.
 */
import { cleanedAnalysisOf, type CleanedAnalysis, type SiteSheet } from '@shared/analysis/cleaned-analysis';
import type { ExportOrigin } from '@shared/export/about-sheet';
import { appendEdit } from '@shared/cleaning/edit-log';
import type { EditLog } from '@shared/cleaning/edit-entry';
import type { CleaningRecord } from '@shared/cleaning/record';
import { cleanedDataExport } from '@shared/export/build-export';
import type { CleanedDataExport } from '@shared/export/export-model';
import type { LoadedSource } from '@shared/host/contract';
import { ProjectSession } from '../../src-main/services/project-session';
import { tempFolder } from '../project/temp-folder';

export interface DemoExport {
  readonly sources: readonly LoadedSource[];
  readonly log: EditLog;
  readonly analysis: CleanedAnalysis;
  readonly siteSheet: SiteSheet;
  readonly origin: ExportOrigin;
  readonly exported: CleanedDataExport;
  /** The record the extra edit changed, as imported. */
  readonly edited: CleaningRecord;
  readonly editedFrom: number;
  readonly editedTo: number;
  /** The count of the edited record's analysis row (site x season x species) before the edit. */
  readonly rowCountBefore: number;
}

export const EXPORTED_AT = '2026-12-01T10:00:00.000Z';

export async function demoExport(): Promise<DemoExport> {
  const folder = tempFolder('tw-export-');
  try {
    const session = new ProjectSession(folder.dir);
    const opened = await session.newFromDemo(true);
    const link = opened.document.sites!;
    const fileName = opened.document.sources.find((s) => s.id === link.sourceId)!.fileName;
    const siteSheet = { link, grid: session.sheetCells(link.sourceId, link.sheet), fileName };
    const before = cleanedAnalysisOf(opened.sources, opened.document.cleaning, siteSheet);
    // The first record counted as a plain number and still in the analysis.
    const edited = before.cleaned.find((r) => !r.excluded && r.fields.status === 'counted' && typeof r.fields.count === 'number' && r.fields.count > 0)!;
    const editedFrom = edited.fields.count as number;
    const editedTo = editedFrom + 7;
    const log = appendEdit(opened.document.cleaning, { kind: 'set-value', recordId: edited.id, field: 'count', old: editedFrom, new: editedTo, reason: 'field card reads 7 more' }, () => new Date('2026-11-30T09:00:00.000Z'));
    const analysis = cleanedAnalysisOf(opened.sources, log, siteSheet);
    const origin: ExportOrigin = { programme: opened.document.programme.name, project: { name: 'demo', saved: false }, software: { name: 'Tallywise', version: 'test' }, createdAt: EXPORTED_AT };
    const exported = cleanedDataExport({ analysis, sources: opened.sources, log, origin });
    const t = before.analysis.table;
    const k = before.analysis.sources.findIndex((list) => list.some((i) => before.cleaned.filter((r) => !r.excluded)[i]?.id === edited.id));
    const rowCountBefore = t.columns.find((c) => c.name === 'count')!.values[k];
    return { sources: opened.sources, log, analysis, siteSheet, origin, exported, edited: before.raw.find((r) => r.id === edited.id)!, editedFrom, editedTo, rowCountBefore };
  } finally {
    folder.remove();
  }
}
