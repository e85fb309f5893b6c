/**
 * What cleaning changed, from the audit log: the edits in effect grouped by
 * what was done and why (records edited or excluded, by reason), and the
 * whole log, undone and reverted entries included, as a table for the
 * spreadsheet. The imported sheets themselves are never changed.
 */
import type { EditEntry, EditLog } from '../cleaning/edit-entry';
import { effectiveEntries, entryStatuses, type EntryStatus } from '../cleaning/edit-log';
import { entryField, entryRecordIds } from '../cleaning/log-filter';
import type { Block, Cell, TableBlock } from './model';

const ACTION: Record<EditEntry['kind'], string> = {
  'set-value': 'value corrected',
  exclude: 'records excluded',
  include: 'records taken back in',
  'merge-name': 'name variants merged',
  'convert-unit': 'unit converted',
  revert: 'earlier edit reverted',
};

const STATUS: Record<EntryStatus, string> = { 'in-effect': 'in effect', reverted: 'reverted', undone: 'undone' };

const NO_REASON = '(no reason given)';

export interface CleaningChange {
  readonly action: string;
  readonly field: string;
  readonly reason: string;
  /** Edits of this kind, field and reason in effect. */
  readonly edits: number;
  /** Records they name (a merge of names names none: it applies to every record with that name). */
  readonly records: number;
}

/** The edits in effect, grouped by action, field and reason, in the order first seen. */
export function cleaningChanges(log: EditLog): CleaningChange[] {
  const groups = new Map<string, { action: string; field: string; reason: string; edits: number; ids: Set<string> }>();
  for (const e of effectiveEntries(log)) {
    const field = entryField(e) ?? '';
    const reason = e.reason?.trim() || NO_REASON;
    const key = JSON.stringify([e.kind, field, reason]);
    let g = groups.get(key);
    if (!g) groups.set(key, (g = { action: ACTION[e.kind], field, reason, edits: 0, ids: new Set() }));
    g.edits++;
    for (const id of entryRecordIds(e)) g.ids.add(id);
  }
  return [...groups.values()].map((g) => ({ action: g.action, field: g.field, reason: g.reason, edits: g.edits, records: g.ids.size }));
}

function valueText(v: string | number | null): string {
  return v === null || v === '' ? '(blank)' : String(v);
}

function changeWords(e: EditEntry): [string, string] {
  switch (e.kind) {
    case 'set-value':
      return [valueText(e.old), valueText(e.new)];
    case 'merge-name':
      return [e.from, e.into];
    case 'convert-unit':
      return [e.fromUnit ?? '', `${e.toUnit ?? ''} (x ${Number(e.factor.toPrecision(6))})`.trim()];
    case 'revert':
      return [e.target, ''];
    default:
      return ['', ''];
  }
}

/** Every entry of the log as a row: id, time, author, action, field, records, from, to, reason, status. */
export function auditLogTable(log: EditLog): TableBlock {
  const statuses = entryStatuses(log);
  const rows = log.entries.map((e): Cell[] => {
    const ids = entryRecordIds(e);
    const [from, to] = changeWords(e);
    return [e.id, e.time, e.author ?? '', ACTION[e.kind], entryField(e) ?? '', ids.length ? ids.join(', ') : '', from, to, e.reason ?? '', STATUS[statuses.get(e.id) ?? 'in-effect']];
  });
  return {
    kind: 'table',
    id: 'audit-log',
    caption: 'Cleaning audit log: every edit, in order',
    columns: ['Edit', 'Time', 'Author', 'Action', 'Field', 'Records', 'From', 'To', 'Reason', 'Status'].map((header) => ({ header })),
    rows,
    notes: ['Undone and reverted edits are listed but do not change the analysis. The imported sheets are never changed; the cleaned table is the import with the edits in effect replayed.'],
  };
}

export function cleaningTable(changes: readonly CleaningChange[]): TableBlock {
  return {
    kind: 'table',
    id: 'cleaning-changes',
    caption: 'What cleaning changed: edits in effect by action and reason',
    columns: [{ header: 'Action' }, { header: 'Field' }, { header: 'Reason' }, { header: 'Edits', format: { kind: 'integer' } }, { header: 'Records', format: { kind: 'integer' } }],
    rows: changes.map((c) => [c.action, c.field, c.reason, c.edits, c.records || null]),
    notes: ['Records: the records the edits name; a merge of name variants applies to every record with that name, shown as a dash.'],
  };
}

/** The blocks of the cleaning part of the data section. */
export function cleaningBlocks(log: EditLog): Block[] {
  const changes = cleaningChanges(log);
  if (!changes.length) return [{ kind: 'paragraph', text: 'Cleaning changed nothing: the analysis uses the records as imported.' }];
  const excluded = changes.filter((c) => c.action === ACTION.exclude).reduce((a, c) => a + c.records, 0);
  const edited = changes.filter((c) => c.action === ACTION['set-value'] || c.action === ACTION['convert-unit']).reduce((a, c) => a + c.records, 0);
  return [
    { kind: 'paragraph', text: `Cleaning left ${excluded} record${excluded === 1 ? '' : 's'} out of the analysis and corrected or converted values in ${edited} record${edited === 1 ? '' : 's'}, each edit with its reason in the audit log (the spreadsheet holds the whole log).` },
    cleaningTable(changes),
    ...mergeList(log),
  ];
}

/** The name variants merged, each as "from" into "into": the names a reader may look for in the sheets. */
function mergeList(log: EditLog): Block[] {
  const items = effectiveEntries(log).flatMap((e) => (e.kind === 'merge-name' ? [`${e.field}: "${e.from}" merged into "${e.into}"`] : []));
  return items.length ? [{ kind: 'list', title: 'Names merged', items }] : [];
}
