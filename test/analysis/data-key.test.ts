import { describe, expect, it } from 'vitest';
import { dataKey } from '@shared/analysis/data-key';
import { appendEdit, emptyLog, undo } from '@shared/cleaning/edit-log';

const at = () => new Date('2026-03-01T10:00:00.000Z');
const log = appendEdit(emptyLog(), { kind: 'merge-name', field: 'site', from: 'Mill pond', into: 'Mill Pond', reason: 'same pond' }, at);

describe('data key', () => {
  it('is the same for the same log whatever the order of its members', () => {
    const e = log.entries[0];
    const reordered = { nextSeq: log.nextSeq, cursor: log.cursor, entries: [Object.fromEntries(Object.entries(e).reverse()) as typeof e] };
    expect(dataKey(['s1'], reordered)).toBe(dataKey(['s1'], log));
  });

  it('changes with the sources, an edit, an undo and the site-list link', () => {
    const k = dataKey(['s1'], log);
    expect(dataKey(['s1', 's2'], log)).not.toBe(k);
    expect(dataKey(['s1'], emptyLog())).not.toBe(k);
    expect(dataKey(['s1'], undo(log))).not.toBe(k);
    expect(dataKey(['s1'], log, { sourceId: 's1', sheet: 'Ponds', headerRow: 1, siteColumn: 'Pond', area: null, covariates: [] })).not.toBe(k);
  });
});
