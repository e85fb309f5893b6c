/**
 * What cleaning changed, from the audit log and, when the report has them,
 * the imported and cleaned records: the changes in effect grouped by what
 * was done and why, with the records each group altered (records edited by
 * field, left out, whose name was merged), the log entries reverted, undone
 * or in conflict with the records, and the whole log as a table for the
 * spreadsheet. The words are the screen's change log's
 * (src-shared/cleaning/describe-entry.ts). The imported sheets are never changed.
 */
import type { LogConflict } from '../cleaning/apply-log';
import { entryAction, statusWords } from '../cleaning/describe-entry';
import type { EditEntry, EditKind, EditLog } from '../cleaning/edit-entry';
import { effectiveEntries, entryStatuses } from '../cleaning/edit-log';
import { entryField, entryRecordIds } from '../cleaning/log-filter';
import type { CleaningRecord } from '../cleaning/record';
import type { Block, Cell, TableBlock } from './model';

/** The records behind the report: as imported, with the log replayed (cleanedAnalysisOf gives all three). */
export interface CleaningRecords {
  readonly raw: readonly CleaningRecord[];
  readonly cleaned: readonly CleaningRecord[];
  readonly conflicts: readonly LogConflict[];
}

/** Only the three parts (a whole analysis may be given; the plan may be copied to a worker). */
export function cleaningRecordsOf(r: CleaningRecords): CleaningRecords {
  return { raw: r.raw, cleaned: r.cleaned, conflicts: r.conflicts };
}

const NO_REASON = '(no reason given)';
export const NOT_COUNTED = 'not counted';

export interface CleaningChange {
  readonly kind: EditKind;
  /** The change in the change log's words ("Set effort", "Left out", "Merged site name"). */
  readonly action: string;
  readonly field: string;
  readonly reason: string;
  /** Log entries of this kind, field and reason in effect. */
  readonly edits: number;
  /**
   * Records they changed, counted on the records when the report has them;
   * from the log alone, the records the entries name, and null for a name
   * merge (it names no record: it applies to every record with that name).
   */
  readonly records: number | null;
  /** The ids counted in `records`. */
  readonly recordIds: readonly string[];
}

/** Which records each entry in effect changed, read from the imported and cleaned records. */
class RecordIndex {
  private readonly raw: ReadonlyMap<string, CleaningRecord>;
  private readonly cleaned: ReadonlyMap<string, CleaningRecord>;
  /** Per field, the names merged into each name so far (a merge of a merge counts the first name's records too). */
  private readonly absorbed = new Map<string, Map<string, Set<string>>>();

  constructor(private readonly records: CleaningRecords) {
    this.raw = new Map(records.raw.map((r) => [r.id, r]));
    this.cleaned = new Map(records.cleaned.map((r) => [r.id, r]));
  }

  touched(e: EditEntry): string[] {
    const present = entryRecordIds(e).filter((id) => this.raw.has(id));
    switch (e.kind) {
      case 'exclude':
        return present.filter((id) => this.cleaned.get(id)?.excluded !== undefined);
      case 'include':
        return present.filter((id) => this.cleaned.get(id)?.excluded === undefined);
      case 'merge-name':
        return this.merged(e);
      default:
        return present;
    }
  }

  /** Records whose imported name is the merged one (or one merged into it before) and whose cleaned name differs. */
  private merged(e: Extract<EditEntry, { kind: 'merge-name' }>): string[] {
    let byName = this.absorbed.get(e.field);
    if (!byName) this.absorbed.set(e.field, (byName = new Map()));
    const origins = new Set([e.from, ...(byName.get(e.from) ?? [])]);
    byName.delete(e.from);
    byName.set(e.into, new Set([...(byName.get(e.into) ?? []), ...origins]));
    return this.records.raw
      .filter((r) => {
        const before = r.fields[e.field];
        return before !== null && before !== undefined && origins.has(String(before)) && this.cleaned.get(r.id)?.fields[e.field] !== before;
      })
      .map((r) => r.id);
  }
}

/** The changes in effect, grouped by kind, field and reason, in the order first seen. */
export function cleaningChanges(log: EditLog, records?: CleaningRecords): CleaningChange[] {
  const index = records ? new RecordIndex(records) : null;
  const groups = new Map<string, { kind: EditKind; action: string; field: string; reason: string; edits: number; ids: Set<string> }>();
  for (const e of effectiveEntries(log)) {
    const field = entryField(e) ?? '';
    const reason = e.reason?.trim() || NO_REASON;
    const key = JSON.stringify([e.kind, field, reason]);
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { kind: e.kind, action: entryAction(e), field, reason, edits: 0, ids: new Set() }));
    g.edits++;
    for (const id of index ? index.touched(e) : entryRecordIds(e)) g.ids.add(id);
  }
  return [...groups.values()].map((g) => ({
    kind: g.kind,
    action: g.action,
    field: g.field,
    reason: g.reason,
    edits: g.edits,
    records: !index && g.kind === 'merge-name' ? null : g.ids.size,
    recordIds: [...g.ids],
  }));
}

/** Distinct records over the changes of some kinds, per field ('' for exclusions). */
function recordsByField(changes: readonly CleaningChange[], kinds: readonly EditKind[]): Map<string, Set<string>> {
  const out = new Map<string, Set<string>>();
  for (const c of changes) {
    if (!kinds.includes(c.kind)) continue;
    let ids = out.get(c.field);
    if (!ids) out.set(c.field, (ids = new Set()));
    for (const id of c.recordIds) ids.add(id);
  }
  return out;
}

export interface CleaningTotals {
  /** Records left out of the analysis by the log. */
  readonly excluded: number;
  /** Records taken back into the analysis by the log. */
  readonly back: number;
  /** Records whose values were set or converted, per field. */
  readonly edited: ReadonlyMap<string, number>;
  /** Records whose name was merged, per field; null when not counted (no records). */
  readonly merged: ReadonlyMap<string, number> | null;
  /** Name merges in effect, per field. */
  readonly merges: ReadonlyMap<string, number>;
  readonly entries: number;
  readonly inEffect: number;
  readonly reverted: number;
  readonly undone: number;
  /** Log entries in conflict with the records; null when not checked (no records). */
  readonly inConflict: number | null;
}

const sizes = (m: Map<string, Set<string>>): Map<string, number> => new Map([...m].map(([k, v]) => [k, v.size]));

export function cleaningTotals(log: EditLog, records?: CleaningRecords, changes: readonly CleaningChange[] = cleaningChanges(log, records)): CleaningTotals {
  const statuses = [...entryStatuses(log).values()];
  const merges = new Map<string, number>();
  for (const c of changes) if (c.kind === 'merge-name') merges.set(c.field, (merges.get(c.field) ?? 0) + c.edits);
  return {
    excluded: recordsByField(changes, ['exclude']).get('')?.size ?? 0,
    back: recordsByField(changes, ['include']).get('')?.size ?? 0,
    edited: sizes(recordsByField(changes, ['set-value', 'convert-unit'])),
    merged: records ? sizes(recordsByField(changes, ['merge-name'])) : null,
    merges,
    entries: log.entries.length,
    inEffect: statuses.filter((s) => s === 'in-effect').length,
    reverted: statuses.filter((s) => s === 'reverted').length,
    undone: statuses.filter((s) => s === 'undone').length,
    inConflict: records ? new Set(records.conflicts.map((c) => c.entryId)).size : null,
  };
}

const plural = (n: number, one: string, many = `${one}s`) => `${n} ${n === 1 ? one : many}`;
const perField = (m: ReadonlyMap<string, number>) => [...m].filter(([, n]) => n > 0).map(([f, n]) => `${f}: ${n}`).join(', ');
const sum = (m: ReadonlyMap<string, number>) => [...m.values()].reduce((a, n) => a + n, 0);

/** The sentences that open the cleaning part: records left out, edited and merged, then the state of the log. */
export function cleaningSentences(t: CleaningTotals): string[] {
  const parts: string[] = [];
  if (t.excluded || !(t.back || sum(t.edited) || t.merges.size)) parts.push(`left ${plural(t.excluded, 'record')} out of the analysis`);
  if (t.back) parts.push(`took ${plural(t.back, 'record')} back into the analysis`);
  const edited = sum(t.edited);
  if (edited) parts.push(`set or converted values in ${plural(edited, 'record')} (${perField(t.edited)})`);
  for (const [field, n] of t.merges) {
    const names = plural(n, 'name variant');
    const merged = t.merged?.get(field);
    parts.push(merged === undefined ? `merged ${names} of ${field} (the records they apply to are ${NOT_COUNTED}: the report was made from the log without the records)` : `merged ${names} of ${field} in ${plural(merged, 'record')}`);
  }
  const last = parts.pop()!;
  const changed = `Cleaning ${parts.length ? `${parts.join(', ')} and ${last}` : last}; each change is in the audit log with its reason (the spreadsheet holds the whole log).`;
  const none = (n: number, word: string) => (n ? `${n} ${word}` : `none ${word}`);
  const conflict =
    t.inConflict === null
      ? 'whether any is in conflict with the imported records was not checked (the report was made without the records)'
      : t.inConflict
        ? `${plural(t.inConflict, 'entry is', 'entries are')} in conflict with the imported records (listed below)`
        : 'none is in conflict with the imported records';
  const state = `The log holds ${plural(t.entries, 'entry', 'entries')}: ${t.inEffect} in effect, ${none(t.reverted, 'reverted')}, ${none(t.undone, 'undone')}; ${conflict}.`;
  return [changed, state];
}

function conflictsByEntry(records?: CleaningRecords): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const c of records?.conflicts ?? []) out.set(c.entryId, [...(out.get(c.entryId) ?? []), c.message]);
  return out;
}

/** Every entry of the log as a row: id, time, author, action, field, records, from, to, reason, status, conflict. */
export function auditLogTable(log: EditLog, records?: CleaningRecords): TableBlock {
  const statuses = entryStatuses(log);
  const conflicts = conflictsByEntry(records);
  const rows = log.entries.map((e): Cell[] => {
    const ids = entryRecordIds(e);
    const [from, to] = changeValues(e);
    return [e.id, e.time, e.author ?? '', entryAction(e), entryField(e) ?? '', ids.join(', '), from, to, e.reason ?? '', statusWords[statuses.get(e.id) ?? 'in-effect'], (conflicts.get(e.id) ?? []).join(' ')];
  });
  return {
    kind: 'table',
    id: 'audit-log',
    caption: 'Cleaning audit log: every change, in order',
    columns: ['Edit', 'Time', 'Author', 'Change', 'Field', 'Records', 'From', 'To', 'Reason', 'Status', 'Conflict with the records'].map((header) => ({ header })),
    rows,
    notes: [
      'The change words are those of the change log on the Records stage. Undone and reverted changes are listed but do not change the analysis. The imported sheets are never changed; the cleaned table is the import with the changes in effect replayed.',
      records ? 'Conflict: what the replay found when a change no longer fits the records (it is then applied as far as it can be).' : 'Conflicts with the records were not checked: the report was made from the log without the records.',
    ],
  };
}

/** From and to as the cells hold them (a trailing space kept in the cell). */
function changeValues(e: EditEntry): [string, string] {
  const text = (v: string | number | null) => (v === null || v === '' ? '(blank)' : String(v));
  switch (e.kind) {
    case 'set-value':
      return [text(e.old), text(e.new)];
    case 'merge-name':
      return [e.from, e.into];
    case 'convert-unit':
      return [e.fromUnit ?? '', `${e.toUnit ?? ''} (× ${Number(e.factor.toPrecision(6))})`.trim()];
    case 'revert':
      return [e.target, ''];
    default:
      return ['', ''];
  }
}

export function cleaningTable(changes: readonly CleaningChange[], counted: boolean): TableBlock {
  return {
    kind: 'table',
    id: 'cleaning-changes',
    caption: 'What cleaning changed: changes in effect by change and reason',
    columns: [{ header: 'Change' }, { header: 'Reason' }, { header: 'Log entries', format: { kind: 'integer' } }, { header: 'Records', format: { kind: 'integer' } }],
    rows: changes.map((c) => [c.action, c.reason, c.edits, c.records ?? NOT_COUNTED]),
    notes: [
      counted
        ? `Records: the records each change altered, counted on the imported and the cleaned records${changes.some((c) => c.kind === 'include') ? ' (a record left out and later taken back counts under "Taken back" only)' : ''}.`
        : `Records: the records the log entries name. A name merge applies to every record with that name; without the records its count is "${NOT_COUNTED}".`,
    ],
  };
}

const MAX_CONFLICTS = 20;

/** The blocks of the cleaning part of the data section. */
export function cleaningBlocks(log: EditLog, records?: CleaningRecords): Block[] {
  const changes = cleaningChanges(log, records);
  const totals = cleaningTotals(log, records, changes);
  if (!changes.length && !totals.entries) return [{ kind: 'paragraph', text: 'Cleaning changed nothing: the analysis uses the records as imported.' }];
  const [changed, state] = cleaningSentences(totals);
  return [
    { kind: 'paragraph', text: changes.length ? `${changed} ${state}` : `No change is in effect: the analysis uses the records as imported. ${state}` },
    ...(changes.length ? [cleaningTable(changes, !!records)] : []),
    ...mergeList(log),
    ...conflictList(records),
  ];
}

/** The name variants merged, each as "from" into "into": the names a reader may look for in the sheets. */
function mergeList(log: EditLog): Block[] {
  const items = effectiveEntries(log).flatMap((e) => (e.kind === 'merge-name' ? [`${e.field}: "${e.from}" merged into "${e.into}"`] : []));
  return items.length ? [{ kind: 'list', title: 'Names merged', items }] : [];
}

function conflictList(records?: CleaningRecords): Block[] {
  const all = records?.conflicts ?? [];
  if (!all.length) return [];
  const items = all.slice(0, MAX_CONFLICTS).map((c) => c.message);
  if (all.length > MAX_CONFLICTS) items.push(`and ${all.length - MAX_CONFLICTS} more, in the audit log sheet`);
  return [{ kind: 'list', title: 'Changes in conflict with the records', items }];
}
