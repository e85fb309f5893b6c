import type { EditEntry, EditKind, EditLog } from './edit-entry';
import { entryStatuses, type EntryStatus } from './edit-log';

/**
 * Picks log entries for the audit view. Every criterion given must hold.
 * `field` matches entries that name that field (set-value, merge-name,
 * convert-unit); `recordId` matches entries that list that record
 * (set-value, exclude, include, convert-unit) — a name merge names no
 * record, so it is found by field, not by record. Reverts match through
 * the entry they cancel.
 */
export interface LogFilter {
  kinds?: readonly EditKind[];
  field?: string;
  recordId?: string;
  statuses?: readonly EntryStatus[];
}

export interface FilteredEntry {
  entry: EditEntry;
  status: EntryStatus;
}

export function entryField(e: EditEntry): string | undefined {
  return e.kind === 'set-value' || e.kind === 'merge-name' || e.kind === 'convert-unit' ? e.field : undefined;
}

export function entryRecordIds(e: EditEntry): readonly string[] {
  if (e.kind === 'set-value') return [e.recordId];
  if (e.kind === 'exclude' || e.kind === 'include' || e.kind === 'convert-unit') return e.recordIds;
  return [];
}

export function filterLog(log: EditLog, filter: LogFilter): FilteredEntry[] {
  const statuses = entryStatuses(log);
  const byId = new Map(log.entries.map((e) => [e.id, e]));
  const subject = (e: EditEntry): EditEntry => (e.kind === 'revert' ? (byId.get(e.target) ?? e) : e);
  return log.entries
    .filter((e) => {
      if (filter.kinds && !filter.kinds.includes(e.kind)) return false;
      if (filter.statuses && !filter.statuses.includes(statuses.get(e.id)!)) return false;
      if (filter.field !== undefined && entryField(subject(e)) !== filter.field) return false;
      if (filter.recordId !== undefined && !entryRecordIds(subject(e)).includes(filter.recordId)) return false;
      return true;
    })
    .map((entry) => ({ entry, status: statuses.get(entry.id)! }));
}
