/**
 * The "Changes" table: every entry of the cleaning log in order, in the
 * words of the Records stage's change log (src-shared/cleaning/describe-entry.ts):
 * what was done, where, when, from what to what, why, and whether it is in
 * effect, undone or reverted.
 */
import type { LogConflict } from '../cleaning/apply-log';
import { describeEntry, statusWords } from '../cleaning/describe-entry';
import type { EditLog } from '../cleaning/edit-entry';
import { entryStatuses } from '../cleaning/edit-log';
import type { CleaningRecord } from '../cleaning/record';
import type { Cell } from '../report/model';
import { cellOf, exportSheet, type ExportSheet } from './export-model';
import { describePlace } from '../cleaning/place-words';
import type { RecordPlace } from './record-places';

export interface ChangesSheetInput {
  readonly log: EditLog;
  readonly raw: readonly CleaningRecord[];
  readonly places: ReadonlyMap<string, RecordPlace>;
  readonly conflicts: readonly LogConflict[];
}

export function changesSheet(input: ChangesSheetInput): ExportSheet {
  const rawById = new Map(input.raw.map((r) => [r.id, r]));
  const entries = new Map(input.log.entries.map((e) => [e.id, e]));
  const statuses = entryStatuses(input.log);
  const conflicts = new Map<string, string[]>();
  for (const c of input.conflicts) conflicts.set(c.entryId, [...(conflicts.get(c.entryId) ?? []), c.message]);
  const ctx = {
    record: (id: string) => rawById.get(id),
    place: (id: string) => {
      const p = input.places.get(id);
      return p ? describePlace(p) : undefined;
    },
    file: (id: string) => input.places.get(id)?.file,
    entry: (id: string) => entries.get(id),
  };
  const rows = input.log.entries.map((e): Cell[] => {
    const t = describeEntry(e, ctx);
    return [e.id, e.time, t.what, t.where, cellOf(t.file), cellOf(t.old), cellOf(t.new), cellOf(e.reason), cellOf(e.author), statusWords[statuses.get(e.id) ?? 'in-effect'], cellOf((conflicts.get(e.id) ?? []).join(' '))];
  });
  const headers = ['Change', 'When', 'What', 'Where', 'File', 'From', 'To', 'Reason', 'Author', 'Status', 'Conflict with the records'];
  return exportSheet('changes', 'Changes', 'The cleaning change log, every entry in order', headers.map((header) => ({ header })), rows);
}
