import { describe, expect, it } from 'vitest';
import { appendEdit, canRedo, canUndo, effectiveEntries, emptyLog, entryStatuses, EditLogError, redo, revertEntry, undo } from '@shared/cleaning/edit-log';
import { editLogSchema, type EditDraft } from '@shared/cleaning/edit-entry';

// Expected behaviour is the usual editor history (common practice): undo and
// redo move a cursor; a new edit after undoing drops the undone entries.
const clock = () => new Date('2026-03-01T10:00:00.000Z');
const set = (recordId: string, old: number, value: number): EditDraft => ({ kind: 'set-value', recordId, field: 'count', old, new: value });

function logOf(...drafts: EditDraft[]) {
  return drafts.reduce((log, d) => appendEdit(log, d, clock), emptyLog());
}

describe('edit log history', () => {
  it('numbers entries, stamps time and keeps the caller’s log unchanged', () => {
    const a = logOf(set('r1', 1, 2));
    const b = appendEdit(a, set('r2', 3, 4), clock);
    expect(a.entries).toHaveLength(1);
    expect(b.entries.map((e) => e.id)).toEqual(['e1', 'e2']);
    expect(b.entries[1].time).toBe('2026-03-01T10:00:00.000Z');
    expect(editLogSchema.safeParse(b).success).toBe(true);
  });

  it('undo and redo move the cursor without deleting anything', () => {
    const log = logOf(set('r1', 1, 2), set('r1', 2, 3));
    const u = undo(undo(log));
    expect(u.entries).toHaveLength(2);
    expect(u.cursor).toBe(0);
    expect(canUndo(u)).toBe(false);
    expect(undo(u)).toBe(u);
    const r = redo(u);
    expect(r.cursor).toBe(1);
    expect(effectiveEntries(r).map((e) => e.id)).toEqual(['e1']);
    expect(canRedo(redo(r))).toBe(false);
  });

  it('a new edit after undoing drops the undone entries, and ids are not reused', () => {
    const log = undo(logOf(set('r1', 1, 2), set('r1', 2, 3)));
    const next = appendEdit(log, set('r9', 0, 5), clock);
    expect(next.entries.map((e) => e.id)).toEqual(['e1', 'e3']);
    expect(canRedo(next)).toBe(false);
  });

  it('reverting an entry in the middle keeps it in the history and cancels only it', () => {
    const log = revertEntry(logOf(set('r1', 1, 2), set('r2', 1, 5), set('r3', 1, 7)), 'e2', { reason: 'wrong sheet' }, clock);
    expect(log.entries.map((e) => e.kind)).toEqual(['set-value', 'set-value', 'set-value', 'revert']);
    expect(effectiveEntries(log).map((e) => e.id)).toEqual(['e1', 'e3']);
    expect(entryStatuses(log).get('e2')).toBe('reverted');
    expect(log.entries[3]).toMatchObject({ target: 'e2', reason: 'wrong sheet' });
  });

  it('undoing a revert, or reverting the revert, brings the entry back', () => {
    const reverted = revertEntry(logOf(set('r1', 1, 2), set('r2', 1, 5)), 'e1', {}, clock);
    expect(effectiveEntries(undo(reverted)).map((e) => e.id)).toEqual(['e1', 'e2']);
    const restored = revertEntry(reverted, 'e3', {}, clock);
    expect(effectiveEntries(restored).map((e) => e.id)).toEqual(['e1', 'e2']);
    expect(entryStatuses(restored).get('e3')).toBe('reverted');
  });

  it('refuses to revert an unknown, undone or already reverted entry with a plain message', () => {
    const log = logOf(set('r1', 1, 2), set('r2', 1, 5));
    expect(() => revertEntry(log, 'e7')).toThrow(/no edit "e7"/);
    expect(() => revertEntry(undo(log), 'e2')).toThrow(/undone; redo it/);
    expect(() => revertEntry(revertEntry(log, 'e1'), 'e1')).toThrow(EditLogError);
  });

  it('the stored log schema rejects a cursor past the end and duplicate ids', () => {
    const log = logOf(set('r1', 1, 2));
    expect(editLogSchema.safeParse({ ...log, cursor: 2 }).success).toBe(false);
    expect(editLogSchema.safeParse({ ...log, entries: [log.entries[0], log.entries[0]], cursor: 2 }).success).toBe(false);
  });
});
