import type { EditDraft, EditLog } from '@shared/cleaning/edit-entry';
import { appendEdit, canRedo, canUndo, redo, undo } from '@shared/cleaning/edit-log';

/**
 * Several log entries made by one action (a visit's effort corrected on each
 * of its species records) share one time stamp; undo and redo step over
 * them together, so one Ctrl+Z takes back one action.
 */
export function appendGroup(log: EditLog, drafts: readonly EditDraft[], now: Date = new Date()): EditLog {
  const time = now.toISOString();
  return drafts.reduce((l, d) => appendEdit(l, { ...d, time }), log);
}

export function undoGroup(log: EditLog): EditLog {
  if (!canUndo(log)) return log;
  const time = log.entries[log.cursor - 1].time;
  let l = log;
  while (canUndo(l) && l.entries[l.cursor - 1].time === time) l = undo(l);
  return l;
}

export function redoGroup(log: EditLog): EditLog {
  if (!canRedo(log)) return log;
  const time = log.entries[log.cursor].time;
  let l = log;
  while (canRedo(l) && l.entries[l.cursor].time === time) l = redo(l);
  return l;
}
