import { parseNumber } from '../data/table';
import type { EditEntry, EditLog } from './edit-entry';
import { effectiveEntries } from './edit-log';
import type { CleaningRecord, FieldValue } from './record';

/**
 * The cleaned records: the raw records with the log's entries in effect
 * replayed in order. Pure: the raw records are never modified; a record no
 * entry touches is handed on as the same object, a touched one is copied once.
 *
 * An entry that cannot be applied as written does not stop the replay; it is
 * listed in `conflicts` (typically after an earlier edit was reverted):
 * a record id that is not in the import, a set-value whose `old` no longer
 * matches (the new value is applied anyway), a merge that matches no record,
 * a unit conversion of a value that is not a number (left as it is).
 */
export interface LogConflict {
  entryId: string;
  recordId?: string;
  message: string;
}

export interface CleanedRecords<R extends { readonly id: string }> {
  records: R[];
  conflicts: LogConflict[];
}

/**
 * How the replay reads and writes a record. Two layouts: field values in a
 * `fields` map (CleaningRecord), or as the record's own properties (a flat
 * record such as an imported count with an `id`).
 */
interface RecordLayout<R> {
  get(r: R, field: string): FieldValue | undefined;
  /** A shallow copy the replay may change. */
  copy(r: R): R;
  set(r: R, field: string, value: FieldValue): void;
  /** Sets the exclusion reason, or removes it (undefined). */
  exclude(r: R, reason: string | undefined): void;
  /** Whether a field may be edited (a flat record's `id` and `excluded` may not). */
  editable(field: string): boolean;
}

type Writable = { excluded?: string } & Record<string, unknown>;

function setExcluded(r: Writable, reason: string | undefined): void {
  if (reason === undefined) delete r.excluded;
  else r.excluded = reason;
}

const nestedLayout: RecordLayout<CleaningRecord> = {
  get: (r, field) => r.fields[field],
  copy: (r) => ({ ...r, fields: { ...r.fields } }),
  set: (r, field, value) => {
    (r.fields as Record<string, FieldValue>)[field] = value;
  },
  exclude: (r, reason) => setExcluded(r as unknown as Writable, reason),
  editable: () => true,
};

/** A flat record: an id, field values as properties, and the exclusion reason. */
export interface FlatRecord {
  readonly id: string;
  readonly excluded?: string;
}

const flatLayout: RecordLayout<FlatRecord> = {
  get: (r, field) => (r as unknown as Record<string, FieldValue | undefined>)[field],
  copy: (r) => ({ ...r }),
  set: (r, field, value) => {
    (r as unknown as Writable)[field] = value;
  },
  exclude: (r, reason) => setExcluded(r as unknown as Writable, reason),
  editable: (field) => field !== 'id' && field !== 'excluded',
};

/** Text a name merge compares: names match by their exact text; blanks never match. */
function nameKey(v: FieldValue | undefined): string | null {
  return v === null || v === undefined ? null : String(v);
}

function show(v: FieldValue | undefined): string {
  return v === null || v === undefined ? '(blank)' : typeof v === 'string' ? `"${v}"` : String(v);
}

class Replay<R extends { readonly id: string }> {
  readonly out: R[];
  readonly conflicts: LogConflict[] = [];
  private readonly copied: Uint8Array;
  private byId?: Map<string, number>;
  private readonly names = new Map<string, Map<string, Set<number>>>();

  constructor(
    raw: readonly R[],
    private readonly layout: RecordLayout<R>,
  ) {
    this.out = raw.slice();
    this.copied = new Uint8Array(raw.length);
  }

  private indexOf(entry: EditEntry, recordId: string): number | undefined {
    if (!this.byId) {
      this.byId = new Map();
      for (let i = 0; i < this.out.length; i++) if (!this.byId.has(this.out[i].id)) this.byId.set(this.out[i].id, i);
    }
    const i = this.byId.get(recordId);
    if (i === undefined) {
      this.conflicts.push({ entryId: entry.id, recordId, message: `Edit ${entry.id} names record "${recordId}", which is not in the imported data; it was skipped.` });
    }
    return i;
  }

  private record(i: number): R {
    if (!this.copied[i]) {
      this.out[i] = this.layout.copy(this.out[i]);
      this.copied[i] = 1;
    }
    return this.out[i];
  }

  private fieldOf(e: EditEntry, field: string): boolean {
    if (this.layout.editable(field)) return true;
    this.conflicts.push({ entryId: e.id, message: `Edit ${e.id} changes "${field}", which identifies the record and cannot be edited; it was skipped.` });
    return false;
  }

  private nameIndex(field: string): Map<string, Set<number>> {
    let index = this.names.get(field);
    if (!index) {
      index = new Map();
      for (let i = 0; i < this.out.length; i++) {
        const k = nameKey(this.layout.get(this.out[i], field));
        if (k === null) continue;
        let set = index.get(k);
        if (!set) index.set(k, (set = new Set()));
        set.add(i);
      }
      this.names.set(field, index);
    }
    return index;
  }

  private setField(i: number, field: string, value: FieldValue): void {
    const r = this.record(i);
    const index = this.names.get(field);
    if (index) {
      const before = nameKey(this.layout.get(r, field));
      const after = nameKey(value);
      if (before !== null) index.get(before)?.delete(i);
      if (after !== null) {
        let set = index.get(after);
        if (!set) index.set(after, (set = new Set()));
        set.add(i);
      }
    }
    this.layout.set(r, field, value);
  }

  apply(e: EditEntry): void {
    switch (e.kind) {
      case 'set-value': {
        if (!this.fieldOf(e, e.field)) return;
        const i = this.indexOf(e, e.recordId);
        if (i === undefined) return;
        const current = this.layout.get(this.out[i], e.field) ?? null;
        if (current !== e.old) {
          this.conflicts.push({
            entryId: e.id,
            recordId: e.recordId,
            message: `Edit ${e.id} expected ${e.field} of record "${e.recordId}" to be ${show(e.old)} but found ${show(current)}; ${show(e.new)} was set anyway.`,
          });
        }
        this.setField(i, e.field, e.new);
        return;
      }
      case 'exclude':
      case 'include':
        for (const id of e.recordIds) {
          const i = this.indexOf(e, id);
          if (i === undefined) continue;
          this.layout.exclude(this.record(i), e.kind === 'exclude' ? e.reason : undefined);
        }
        return;
      case 'merge-name': {
        if (e.from === e.into || !this.fieldOf(e, e.field)) return;
        const index = this.nameIndex(e.field);
        const from = index.get(e.from);
        if (!from || from.size === 0) {
          this.conflicts.push({ entryId: e.id, message: `Edit ${e.id} merges ${e.field} "${e.from}" into "${e.into}", but no record has ${e.field} "${e.from}".` });
          return;
        }
        for (const i of from) this.layout.set(this.record(i), e.field, e.into);
        // union of the two name groups: the smaller set is poured into the larger
        const into = index.get(e.into);
        if (!into) index.set(e.into, from);
        else if (into.size >= from.size) for (const i of from) into.add(i);
        else {
          for (const i of into) from.add(i);
          index.set(e.into, from);
        }
        index.delete(e.from);
        return;
      }
      case 'convert-unit':
        if (!this.fieldOf(e, e.field)) return;
        for (const id of e.recordIds) {
          const i = this.indexOf(e, id);
          if (i === undefined) continue;
          const v = this.layout.get(this.out[i], e.field) ?? null;
          if (v === null || v === '') continue;
          const x = typeof v === 'number' ? v : parseNumber(v);
          if (!Number.isFinite(x)) {
            this.conflicts.push({ entryId: e.id, recordId: id, message: `Edit ${e.id} converts ${e.field} of record "${id}", but ${show(v)} is not a number; it was left as it is.` });
            continue;
          }
          this.setField(i, e.field, x * e.factor);
        }
        return;
      case 'revert':
        return; // handled by effectiveEntries
    }
  }
}

function replay<R extends { readonly id: string }>(raw: readonly R[], log: EditLog, layout: RecordLayout<R>): CleanedRecords<R> {
  const run = new Replay(raw, layout);
  for (const e of effectiveEntries(log)) run.apply(e);
  return { records: run.out, conflicts: run.conflicts };
}

/** The cleaned records of records whose values sit in a `fields` map. */
export function applyLog<R extends CleaningRecord>(raw: readonly R[], log: EditLog): CleanedRecords<R> {
  return replay(raw, log, nestedLayout as unknown as RecordLayout<R>);
}

/**
 * The same for flat records (field values as the record's own properties,
 * e.g. an imported count with an `id`): a field named in the log is the
 * property of that name; `id` and `excluded` cannot be edited.
 */
export function applyLogToFlatRecords<R extends FlatRecord>(raw: readonly R[], log: EditLog): CleanedRecords<R> {
  return replay(raw, log, flatLayout as unknown as RecordLayout<R>);
}
