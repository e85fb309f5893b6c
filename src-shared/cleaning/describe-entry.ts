import type { EditEntry, EditKind } from './edit-entry';
import type { EntryStatus } from './edit-log';
import { entryRecordIds } from './log-filter';
import type { CleaningRecord, FieldValue } from './record';
import { covariateOfField } from '../import/visit-covariates';

/**
 * The words for a cleaning log entry, one wording for the screen's change
 * log and the report (its "What cleaning changed" section and audit log
 * sheet), so the analyst reads the same words in both.
 */
export interface EntryText {
  what: string;
  where: string;
  /** The workbook of the (first) record, when known. */
  file?: string;
  old: string;
  new: string;
}

/** What the describer may know beyond the entry; each part is optional. */
export interface EntryContext {
  /** The raw record of an id. */
  record?(id: string): CleaningRecord | undefined;
  /** Where a record sits in its workbook ("Counts, row 23, col. G"). */
  place?(id: string): string | undefined;
  /** The workbook a record came from. */
  file?(id: string): string | undefined;
  /** An entry of the same log by id (what a revert cancels). */
  entry?(id: string): EditEntry | undefined;
}

export const fieldNames: Record<string, string> = {
  site: 'site',
  species: 'species',
  date: 'date',
  count: 'count',
  effort: 'effort',
};

/** The kinds of change as the change log's filter and the report's groups name them. */
export const kindWords: Record<EditKind, string> = {
  'set-value': 'Cell edits',
  exclude: 'Left out',
  include: 'Taken back',
  'merge-name': 'Name merges',
  'convert-unit': 'Unit conversions',
  revert: 'Reverts',
};

export const statusWords: Record<EntryStatus, string> = { 'in-effect': 'in effect', reverted: 'reverted', undone: 'undone' };

function fieldWord(field: string): string {
  return fieldNames[field] ?? covariateOfField(field) ?? field;
}

export function showValue(v: FieldValue | undefined): string {
  if (v === null || v === undefined || v === '') return '(blank)';
  if (typeof v === 'number') return Number.isInteger(v) ? String(v) : String(Number(v.toFixed(4)));
  // A trailing space is invisible in quotes; say it.
  return `"${v}"${/\s$/.test(v) ? ' (ending in a space)' : ''}`;
}

/** What an entry does, in the words of the change log's heading ("Set effort", "Left out", "Merged site name"). */
export function entryAction(e: EditEntry): string {
  switch (e.kind) {
    case 'set-value':
      return `Set ${fieldWord(e.field)}`;
    case 'exclude':
      return 'Left out';
    case 'include':
      return 'Taken back';
    case 'merge-name':
      return `Merged ${fieldWord(e.field)} name`;
    case 'convert-unit':
      return `Converted ${fieldWord(e.field)}`;
    case 'revert':
      return `Reverted ${e.target}`;
  }
}

function recordsWhere(ids: readonly string[], ctx: EntryContext): string {
  const at = ctx.place?.(ids[0]) ?? ids[0];
  return ids.length === 1 ? at : `${ids.length} records, first ${at}`;
}

export function describeEntry(e: EditEntry, ctx: EntryContext = {}): EntryText {
  const ids = entryRecordIds(e);
  const file = ids.length ? ctx.file?.(ids[0]) : undefined;
  return { ...describeChange(e, ctx), file };
}

function describeChange(e: EditEntry, ctx: EntryContext): EntryText {
  const what = entryAction(e);
  switch (e.kind) {
    case 'set-value': {
      const rec = ctx.record?.(e.recordId);
      const who = rec ? `${String(rec.fields['site'] ?? '').trim()}, ${rec.fields['species'] ?? ''}` : e.recordId;
      return { what, where: `${who} · ${recordsWhere([e.recordId], ctx)}`, old: showValue(e.old), new: showValue(e.new) };
    }
    case 'exclude':
      return { what, where: recordsWhere(e.recordIds, ctx), old: 'in the analysis', new: 'left out' };
    case 'include':
      return { what, where: recordsWhere(e.recordIds, ctx), old: 'left out', new: 'in the analysis' };
    case 'merge-name':
      return { what, where: `every record named ${showValue(e.from)}`, old: showValue(e.from), new: showValue(e.into) };
    case 'convert-unit':
      return { what, where: recordsWhere(e.recordIds, ctx), old: e.fromUnit ?? '', new: `${e.toUnit ?? ''} (× ${Number(e.factor.toPrecision(6))})` };
    case 'revert': {
      const target = ctx.entry?.(e.target);
      const t = target ? describeEntry(target, ctx) : undefined;
      return { what, where: t ? `${t.what.toLowerCase()}: ${t.where}` : e.target, old: t?.new ?? '', new: t?.old ?? '' };
    }
  }
}
