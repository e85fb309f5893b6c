import { describe, expect, it } from 'vitest';
import { applyLog, applyLogToFlatRecords } from '@shared/cleaning/apply-log';
import { appendEdit, emptyLog, revertEntry, undo } from '@shared/cleaning/edit-log';
import type { EditDraft } from '@shared/cleaning/edit-entry';
import type { CleaningRecord } from '@shared/cleaning/record';

// Expected values below are worked by hand from the entry definitions in
// src-shared/cleaning/edit-entry.ts (a small hand-made table, not simulation).
const raw: CleaningRecord[] = [
  { id: 'r1', fields: { site: 'North Marsh', species: 'Teal', count: 4, effort: 90 } },
  { id: 'r2', fields: { site: 'N. Marsh', species: 'Teal', count: 2, effort: 60 } },
  { id: 'r3', fields: { site: 'N. Marsh', species: 'Wigeon', count: null, effort: '30' } },
  { id: 'r4', fields: { site: 'South Pool', species: 'teal', count: 7, effort: 'n/a' } },
];
const frozen = JSON.stringify(raw);
const clock = () => new Date('2026-03-01T10:00:00.000Z');
const logOf = (...drafts: EditDraft[]) => drafts.reduce((log, d) => appendEdit(log, d, clock), emptyLog());

describe('applyLog', () => {
  it('an empty log gives the raw records, the very same objects', () => {
    const { records, conflicts } = applyLog(raw, emptyLog());
    expect(records).toEqual(raw);
    expect(records[2]).toBe(raw[2]);
    expect(conflicts).toEqual([]);
  });

  it('sets a value, excludes and includes records, never touching the raw ones', () => {
    const log = logOf(
      { kind: 'set-value', recordId: 'r3', field: 'count', old: null, new: 0, reason: 'blank means none seen' },
      { kind: 'exclude', recordIds: ['r2', 'r4'], reason: 'visit abandoned' },
      { kind: 'include', recordIds: ['r4'] },
    );
    const { records, conflicts } = applyLog(raw, log);
    expect(records[2].fields.count).toBe(0);
    expect(records[1].excluded).toBe('visit abandoned');
    expect('excluded' in records[3]).toBe(false);
    expect(records[0]).toBe(raw[0]);
    expect(conflicts).toEqual([]);
    expect(JSON.stringify(raw)).toBe(frozen);
  });

  it('merges a name variant: every record reading A becomes B, others stay', () => {
    const { records } = applyLog(raw, logOf({ kind: 'merge-name', field: 'site', from: 'N. Marsh', into: 'North Marsh' }));
    expect(records.map((r) => r.fields.site)).toEqual(['North Marsh', 'North Marsh', 'North Marsh', 'South Pool']);
    // exact text match: "teal" is not merged by a merge of "Teal"
    const sp = applyLog(raw, logOf({ kind: 'merge-name', field: 'species', from: 'Teal', into: 'Eurasian teal' }));
    expect(sp.records.map((r) => r.fields.species)).toEqual(['Eurasian teal', 'Eurasian teal', 'Wigeon', 'teal']);
  });

  it('a merge sees values set by earlier edits and later edits see the merge', () => {
    const log = logOf(
      { kind: 'set-value', recordId: 'r4', field: 'site', old: 'South Pool', new: 'N. Marsh' },
      { kind: 'merge-name', field: 'site', from: 'N. Marsh', into: 'North Marsh' },
      { kind: 'set-value', recordId: 'r2', field: 'site', old: 'North Marsh', new: 'Reedbed' },
      { kind: 'merge-name', field: 'site', from: 'North Marsh', into: 'Marsh' },
    );
    expect(applyLog(raw, log).records.map((r) => r.fields.site)).toEqual(['Marsh', 'Reedbed', 'Marsh', 'Marsh']);
  });

  it('undoing a merge restores exactly the records it changed (not those that read B before)', () => {
    const log = logOf({ kind: 'merge-name', field: 'site', from: 'N. Marsh', into: 'North Marsh' });
    expect(applyLog(raw, undo(log)).records.map((r) => r.fields.site)).toEqual(['North Marsh', 'N. Marsh', 'N. Marsh', 'South Pool']);
  });

  it('converts an effort unit for the listed records; text numbers convert, other text is reported', () => {
    const log = logOf({ kind: 'convert-unit', field: 'effort', recordIds: ['r1', 'r3', 'r4'], factor: 1 / 60, fromUnit: 'min', toUnit: 'h' });
    const { records, conflicts } = applyLog(raw, log);
    expect(records[0].fields.effort).toBeCloseTo(1.5, 12);
    expect(records[1].fields.effort).toBe(60);
    expect(records[2].fields.effort).toBeCloseTo(0.5, 12);
    expect(records[3].fields.effort).toBe('n/a');
    expect(conflicts).toHaveLength(1);
    expect(conflicts[0].message).toMatch(/record "r4".*"n\/a" is not a number/);
  });

  it('reverting an edit from the middle replays the rest and reports stale old values', () => {
    let log = logOf(
      { kind: 'set-value', recordId: 'r1', field: 'count', old: 4, new: 40 },
      { kind: 'set-value', recordId: 'r1', field: 'count', old: 40, new: 14 },
      { kind: 'exclude', recordIds: ['r2'], reason: 'duplicate visit' },
    );
    log = revertEntry(log, 'e1', { reason: 'typo was in the second edit' }, clock);
    const { records, conflicts } = applyLog(raw, log);
    expect(records[0].fields.count).toBe(14);
    expect(records[1].excluded).toBe('duplicate visit');
    expect(conflicts).toHaveLength(1);
    expect(conflicts[0]).toMatchObject({ entryId: 'e2', recordId: 'r1' });
    expect(conflicts[0].message).toMatch(/expected count .* to be 40 but found 4/);
  });

  it('names an unknown record and a merge that matches nothing, and goes on', () => {
    const log = logOf(
      { kind: 'exclude', recordIds: ['r1', 'zz'], reason: 'test' },
      { kind: 'merge-name', field: 'site', from: 'Nowhere', into: 'North Marsh' },
    );
    const { records, conflicts } = applyLog(raw, log);
    expect(records[0].excluded).toBe('test');
    expect(conflicts.map((c) => c.message)).toEqual([
      expect.stringMatching(/record "zz", which is not in the imported data/),
      expect.stringMatching(/no record has site "Nowhere"/),
    ]);
  });
});

describe('applyLogToFlatRecords', () => {
  // the same edits on records whose values are their own properties
  type Count = { id: string; sheet: string; row: number; site: string; count: number | null; effort: number | null; excluded?: string };
  const flat: Count[] = [
    { id: 'a', sheet: 'Counts', row: 2, site: 'N. Marsh', count: 3, effort: 120 },
    { id: 'b', sheet: 'Counts', row: 3, site: 'South Pool', count: null, effort: 60 },
  ];
  const frozenFlat = JSON.stringify(flat);

  it('edits properties, keeps the others and never touches the raw records', () => {
    const log = logOf(
      { kind: 'merge-name', field: 'site', from: 'N. Marsh', into: 'North Marsh' },
      { kind: 'set-value', recordId: 'b', field: 'count', old: null, new: 0 },
      { kind: 'convert-unit', field: 'effort', recordIds: ['a', 'b'], factor: 1 / 60 },
      { kind: 'exclude', recordIds: ['b'], reason: 'late visit' },
    );
    const { records, conflicts } = applyLogToFlatRecords(flat, log);
    expect(records).toEqual([
      { id: 'a', sheet: 'Counts', row: 2, site: 'North Marsh', count: 3, effort: 2 },
      { id: 'b', sheet: 'Counts', row: 3, site: 'South Pool', count: 0, effort: 1, excluded: 'late visit' },
    ]);
    expect(conflicts).toEqual([]);
    expect(JSON.stringify(flat)).toBe(frozenFlat);
  });

  it('refuses to edit the id or the exclusion through set-value', () => {
    const { records, conflicts } = applyLogToFlatRecords(flat, logOf({ kind: 'set-value', recordId: 'a', field: 'id', old: 'a', new: 'z' }));
    expect(records[0].id).toBe('a');
    expect(conflicts[0].message).toMatch(/"id", which identifies the record/);
  });
});
