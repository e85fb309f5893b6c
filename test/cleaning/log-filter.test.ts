import { describe, expect, it } from 'vitest';
import { filterLog } from '@shared/cleaning/log-filter';
import { appendEdit, emptyLog, revertEntry, undo } from '@shared/cleaning/edit-log';
import type { EditDraft } from '@shared/cleaning/edit-entry';

const clock = () => new Date('2026-03-01T10:00:00.000Z');
const drafts: EditDraft[] = [
  { kind: 'set-value', recordId: 'r1', field: 'count', old: 1, new: 2 },
  { kind: 'merge-name', field: 'site', from: 'A', into: 'B' },
  { kind: 'exclude', recordIds: ['r1', 'r2'], reason: 'flooded' },
  { kind: 'convert-unit', field: 'effort', recordIds: ['r2'], factor: 60 },
  { kind: 'set-value', recordId: 'r2', field: 'site', old: 'B', new: 'C' },
];
const base = drafts.reduce((log, d) => appendEdit(log, d, clock), emptyLog());
const ids = (xs: { entry: { id: string } }[]) => xs.map((x) => x.entry.id);

describe('filterLog', () => {
  it('filters by kind, field and record', () => {
    expect(ids(filterLog(base, { kinds: ['set-value'] }))).toEqual(['e1', 'e5']);
    expect(ids(filterLog(base, { field: 'site' }))).toEqual(['e2', 'e5']);
    expect(ids(filterLog(base, { recordId: 'r1' }))).toEqual(['e1', 'e3']);
    expect(ids(filterLog(base, { recordId: 'r2', kinds: ['exclude', 'convert-unit'] }))).toEqual(['e3', 'e4']);
  });

  it('gives each entry its status and finds a revert through its target', () => {
    const log = undo(revertEntry(base, 'e3', {}, clock)); // the revert is undone again
    const reverted = revertEntry(base, 'e3', {}, clock);
    expect(filterLog(log, { recordId: 'r1' }).map((x) => x.status)).toEqual(['in-effect', 'in-effect', 'undone']);
    expect(filterLog(reverted, { recordId: 'r1' }).map((x) => x.status)).toEqual(['in-effect', 'reverted', 'in-effect']);
    expect(ids(filterLog(reverted, { statuses: ['reverted'] }))).toEqual(['e3']);
  });
});
