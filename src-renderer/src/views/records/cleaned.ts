import { applyLog, type LogConflict } from '@shared/cleaning/apply-log';
import type { EditLog } from '@shared/cleaning/edit-entry';
import type { CleaningRecord } from '@shared/cleaning/record';

/** The cleaned view: raw records with the log replayed (the raw records are never changed). */
export interface CleanedView {
  records: CleaningRecord[];
  byId: Map<string, CleaningRecord>;
  conflicts: LogConflict[];
}

export function cleanRecords(raw: readonly CleaningRecord[], log: EditLog): CleanedView {
  const { records, conflicts } = applyLog(raw, log);
  return { records, byId: new Map(records.map((r) => [r.id, r])), conflicts };
}

/** True when the cleaned value of a field differs from the import's. */
export function isEdited(cleaned: CleaningRecord, raw: CleaningRecord | undefined, field: string): boolean {
  return raw !== undefined && cleaned !== raw && cleaned.fields[field] !== raw.fields[field];
}
