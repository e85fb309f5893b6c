/**
 * The "About" sheet: what the export is and where it came from (programme,
 * project, when, which Tallywise, each source workbook with the SHA-256 of
 * its bytes), how many records were kept and left out, the rule that made
 * the analysis table, and the caution that goes with counts.
 */
import type { AggregateRule } from '../import/aggregate';
import type { Cell } from '../report/model';
import { cellOf, exportSheet, type ExportSheet } from './export-model';

export interface ExportOrigin {
  readonly programme: string;
  /** The project's name; `saved` false when the export holds changes not yet saved (or the project was never saved). */
  readonly project: { readonly name: string; readonly saved: boolean };
  /** The project file by name with the SHA-256 of its bytes, when exported from a saved file. */
  readonly projectFile?: { readonly name: string; readonly sha256: string } | null;
  readonly software: { readonly name: string; readonly version: string };
  /** ISO 8601 date-time. */
  readonly createdAt: string;
}

export interface AboutCounts {
  readonly sources: readonly { readonly name: string; readonly sha256: string; readonly records: number }[];
  readonly records: number;
  readonly kept: number;
  readonly leftOut: number;
  readonly analysisRows: number;
  readonly rule: AggregateRule;
  readonly effortColumn?: string;
  readonly changesInEffect: number;
  readonly changes: number;
  readonly siteProblems: readonly string[];
}

const ruleWords: Record<AggregateRule, string> = {
  sum: 'one row per site x season x species; counts summed over its visits with a usable count, effort summed over the same visits',
  max: 'one row per site x season x species; the largest count of its visits, with the effort of that visit',
  mean: 'one row per site x season x species; the mean count per visit, with the mean effort per visit',
};

export const EXPORT_CAUTION =
  'These are the counts as cleaned. They are not population sizes, and nothing here corrects for detection or for changes in effort or method between seasons. Follow the programme\'s protocol, and ask a statistician, before drawing conclusions from them.';

export function aboutSheet(origin: ExportOrigin, counts: AboutCounts): ExportSheet {
  const rows: Cell[][] = [
    ['Programme', origin.programme, null],
    ['Project', origin.project.name, origin.project.saved ? 'as saved' : 'with changes not yet saved: the export holds what the screen showed, which the project file does not (yet)'],
    ...(origin.projectFile ? [['Project file', origin.projectFile.name, `SHA-256 ${origin.projectFile.sha256}`] as Cell[]] : []),
    ['Exported', origin.createdAt, null],
    ['Software', `${origin.software.name} ${origin.software.version}`, null],
    ...counts.sources.map((s): Cell[] => ['Source file', s.name, `SHA-256 ${s.sha256}; ${s.records} records read`]),
    ['Records', counts.records, 'visit records read from the source files (sheet "Records")'],
    ['Records kept', counts.kept, 'used for the analysis table'],
    ['Records left out', counts.leftOut, 'left out in cleaning, each with its reason'],
    ['Changes in effect', counts.changesInEffect, `of ${counts.changes} in the change log (sheet "Changes")`],
    ['Analysis table rows', counts.analysisRows, 'sheet "Analysis table": the table the models are fitted to'],
    ['Aggregation rule', ruleWords[counts.rule], 'records not surveyed, not readable as a count, or present without a number give no count'],
    ...(counts.effortColumn ? [['Effort', counts.effortColumn, 'effort in its canonical unit; log_effort, log_area and offset are natural logs, blank where effort or area is missing or not positive'] as Cell[]] : []),
    ...counts.siteProblems.map((p): Cell[] => ['Site list problem', p, null]),
    ['Records: count', 'Count as read is the count cell\'s text in the workbook; Count used is the number after cleaning (blank where there is none)', 'Status: counted, not-surveyed, present, at-least, approximate or invalid, as the field-code rules read the cell'],
    ['Records: open flags', 'the import checks\' findings not yet dealt with (by an edit of the field or by leaving the record out), by code', null],
    ['Caution', EXPORT_CAUTION, null],
  ];
  return exportSheet('about', 'About', 'What this export holds and where it came from', [{ header: 'Item' }, { header: 'Value', format: { kind: 'general' } }, { header: 'Detail' }], rows.map((r) => r.map((c) => (typeof c === 'string' ? cellOf(c) : c))));
}
