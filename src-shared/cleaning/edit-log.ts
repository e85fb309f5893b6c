import type { EditDraft, EditEntry, EditLog } from './edit-entry';

/**
 * The log as an editor history: a list of entries and a cursor.
 *
 * - `appendEdit` adds an entry at the cursor. Entries that had been undone
 *   (those after the cursor) are dropped at that moment, and only then.
 * - `undo` / `redo` move the cursor; nothing is deleted.
 * - `revertEntry` cancels one earlier entry by appending a `revert` entry, so
 *   the history shows who took it back, when and why. Undoing the revert
 *   brings the entry back; reverting the revert does too.
 *
 * Every function returns a new log; the one given is never modified.
 */

export function emptyLog(): EditLog {
  return { entries: [], cursor: 0, nextSeq: 1 };
}

export class EditLogError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'EditLogError';
  }
}

/** Adds an edit at the cursor (dropping any undone entries) and returns the new log. */
export function appendEdit(log: EditLog, draft: EditDraft, now: () => Date = () => new Date()): EditLog {
  const entry = { ...draft, id: `e${log.nextSeq}`, time: draft.time ?? now().toISOString() } as EditEntry;
  const kept = log.entries.slice(0, log.cursor);
  return { entries: [...kept, entry], cursor: kept.length + 1, nextSeq: log.nextSeq + 1 };
}

export function canUndo(log: EditLog): boolean {
  return log.cursor > 0;
}

export function canRedo(log: EditLog): boolean {
  return log.cursor < log.entries.length;
}

/** Steps back over the last entry in effect; the same log when there is nothing to undo. */
export function undo(log: EditLog): EditLog {
  return canUndo(log) ? { ...log, cursor: log.cursor - 1 } : log;
}

/** Steps forward over the next undone entry; the same log when there is nothing to redo. */
export function redo(log: EditLog): EditLog {
  return canRedo(log) ? { ...log, cursor: log.cursor + 1 } : log;
}

/**
 * Cancels the entry `targetId`, which must be in effect (before the cursor and
 * not already cancelled), by appending a `revert` entry.
 */
export function revertEntry(
  log: EditLog,
  targetId: string,
  meta: { author?: string; reason?: string; time?: string } = {},
  now: () => Date = () => new Date(),
): EditLog {
  const index = log.entries.findIndex((e) => e.id === targetId);
  if (index < 0) throw new EditLogError(`There is no edit "${targetId}" in the cleaning log.`);
  if (index >= log.cursor) throw new EditLogError(`Edit "${targetId}" has been undone; redo it before reverting it.`);
  if (cancelledIds(log).has(targetId)) throw new EditLogError(`Edit "${targetId}" is already reverted.`);
  return appendEdit(log, { kind: 'revert', target: targetId, ...meta }, now);
}

/**
 * Ids of entries in effect that a later revert cancels. Walked from the last
 * entry back, so a revert that is itself reverted cancels nothing.
 */
export function cancelledIds(log: EditLog): Set<string> {
  const cancelled = new Set<string>();
  for (let i = log.cursor - 1; i >= 0; i--) {
    const e = log.entries[i];
    if (e.kind === 'revert' && !cancelled.has(e.id)) cancelled.add(e.target);
  }
  return cancelled;
}

/** The entries that change the records, in order: in effect, not cancelled, not reverts. */
export function effectiveEntries(log: EditLog): EditEntry[] {
  const cancelled = cancelledIds(log);
  return log.entries.slice(0, log.cursor).filter((e) => e.kind !== 'revert' && !cancelled.has(e.id));
}

export type EntryStatus = 'in-effect' | 'reverted' | 'undone';

/** Each entry's status, keyed by id: undone (after the cursor), reverted (cancelled), or in effect. */
export function entryStatuses(log: EditLog): Map<string, EntryStatus> {
  const cancelled = cancelledIds(log);
  const out = new Map<string, EntryStatus>();
  log.entries.forEach((e, i) => out.set(e.id, i >= log.cursor ? 'undone' : cancelled.has(e.id) ? 'reverted' : 'in-effect'));
  return out;
}
