import type { EditEntry } from '@shared/cleaning/edit-entry';
import type { FieldValue } from '@shared/cleaning/record';
import { describePlace, type RecordSet } from './record-set';

/** One log entry as the audit panel shows it: what was done, to what, old and new. */
export interface EntryText {
  what: string;
  where: string;
  /** The workbook of the (first) record, when known. */
  file?: string;
  old: string;
  new: string;
}

export const fieldNames: Record<string, string> = {
  site: 'site',
  species: 'species',
  date: 'date',
  count: 'count',
  effort: 'effort',
};

export function showValue(v: FieldValue | undefined): string {
  if (v === null || v === undefined || v === '') return '(blank)';
  if (typeof v === 'number') return Number.isInteger(v) ? String(v) : String(Number(v.toFixed(4)));
  // A trailing space is invisible in quotes; say it.
  return `"${v}"${/\s$/.test(v) ? ' (ending in a space)' : ''}`;
}

function recordsWhere(ids: readonly string[], set: RecordSet): string {
  const first = set.places.get(ids[0]);
  const at = first ? describePlace(first) : ids[0];
  return ids.length === 1 ? at : `${ids.length} records, first ${at}`;
}

export function describeEntry(e: EditEntry, set: RecordSet, byId: ReadonlyMap<string, EditEntry>): EntryText {
  const ids = e.kind === 'set-value' ? [e.recordId] : e.kind === 'exclude' || e.kind === 'include' || e.kind === 'convert-unit' ? e.recordIds : [];
  const file = ids.length ? set.places.get(ids[0])?.fileName : undefined;
  return { ...describeChange(e, set, byId), file };
}

function describeChange(e: EditEntry, set: RecordSet, byId: ReadonlyMap<string, EditEntry>): EntryText {
  switch (e.kind) {
    case 'set-value': {
      const rec = set.rawById.get(e.recordId);
      const who = rec ? `${String(rec.fields['site'] ?? '').trim()}, ${rec.fields['species'] ?? ''}` : e.recordId;
      return { what: `Set ${fieldNames[e.field] ?? e.field}`, where: `${who} · ${recordsWhere([e.recordId], set)}`, old: showValue(e.old), new: showValue(e.new) };
    }
    case 'exclude':
      return { what: 'Left out', where: recordsWhere(e.recordIds, set), old: 'in the analysis', new: 'left out' };
    case 'include':
      return { what: 'Taken back', where: recordsWhere(e.recordIds, set), old: 'left out', new: 'in the analysis' };
    case 'merge-name':
      return { what: `Merged ${fieldNames[e.field] ?? e.field} name`, where: `every record named ${showValue(e.from)}`, old: showValue(e.from), new: showValue(e.into) };
    case 'convert-unit':
      return { what: `Converted ${fieldNames[e.field] ?? e.field}`, where: recordsWhere(e.recordIds, set), old: e.fromUnit ?? '', new: `${e.toUnit ?? ''} (× ${Number(e.factor.toPrecision(6))})` };
    case 'revert': {
      const target = byId.get(e.target);
      const t = target ? describeEntry(target, set, byId) : undefined;
      return { what: `Reverted ${e.target}`, where: t ? `${t.what.toLowerCase()}: ${t.where}` : e.target, old: t?.new ?? '', new: t?.old ?? '' };
    }
  }
}
