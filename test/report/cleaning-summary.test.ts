/**
 * The report's "What cleaning changed" part and its audit log sheet.
 *
 * 1. A small edit log and records invented for this bookkeeping test: every
 *    expected count is worked out by hand in the comments beside it.
 * 2. The demo project (src-main/demo/demo-project.ts) with its recorded
 *    cleaning: the counts equal what the "Planted problems" list of
 *    resources/demo/README.md implies, read from that file here.
 * 3. The words are the screen's change log's (one wording in src-shared).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { applyLog } from '@shared/cleaning/apply-log';
import { describeEntry } from '@shared/cleaning/describe-entry';
import type { EditLog } from '@shared/cleaning/edit-entry';
import type { CleaningRecord } from '@shared/cleaning/record';
import { auditLogTable, cleaningBlocks, cleaningChanges, cleaningTotals, NOT_COUNTED, type CleaningRecords } from '@shared/report/cleaning-summary';
import type { ListBlock, ParagraphBlock, TableBlock } from '@shared/report/model';
import { demoProject } from '../../src-main/demo/demo-project';
import { projectPlan } from '../../src-main/report/project-report';
import { describeEntry as describeOnScreen } from '../../src-renderer/src/views/records/describe-entry';
import type { RecordSet } from '../../src-renderer/src/views/records/record-set';

const t = '2026-01-01T00:00:00.000Z';
const rec = (id: string, site: string, species: string, count: number, effort: number | null = 10): CleaningRecord => ({ id, fields: { site, species, count, effort } });

// Invented records: two sites typed two ways, one count typed 400 for 40.
const raw: CleaningRecord[] = [
  rec('r1', 'Pond A', 'toad', 3),
  rec('r2', 'Pond A', 'frog', 1),
  rec('r3', 'Pond  A', 'toad', 2),
  rec('r4', 'Pond  A', 'frog', 400),
  rec('r5', 'Pond B', 'toad', 5),
  rec('r6', 'pond b', 'frog', 0),
  rec('r7', 'Pond C', 'toad', 1),
];

const log: EditLog = {
  entries: [
    { id: 'e1', time: t, kind: 'exclude', recordIds: ['r1', 'r2'], reason: 'pond dry' },
    { id: 'e2', time: t, kind: 'set-value', recordId: 'r4', field: 'count', old: 400, new: 40, reason: 'typing slip' },
    { id: 'e3', time: t, kind: 'merge-name', field: 'site', from: 'Pond  A', into: 'Pond A' },
    { id: 'e4', time: t, kind: 'exclude', recordIds: ['r5'], reason: 'wrong form' },
    { id: 'e5', time: t, kind: 'revert', target: 'e4' },
    // old 9 does not match the record's 1: a conflict (the new value is set anyway)
    { id: 'e6', time: t, kind: 'set-value', recordId: 'r7', field: 'count', old: 9, new: 2, reason: 'recount' },
    { id: 'e7', time: t, kind: 'merge-name', field: 'site', from: 'pond b', into: 'Pond B', reason: 'case' },
    // r99 is not in the import: a conflict, no record changed
    { id: 'e8', time: t, kind: 'set-value', recordId: 'r99', field: 'effort', old: null, new: 10, reason: 'field card' },
    { id: 'e9', time: t, kind: 'exclude', recordIds: ['r6'], reason: 'undone later' },
  ],
  cursor: 8,
  nextSeq: 10,
};

function recordsOf(rawRecords: CleaningRecord[], l: EditLog): CleaningRecords {
  const { records, conflicts } = applyLog(rawRecords, l);
  return { raw: rawRecords, cleaned: records, conflicts };
}

const records = recordsOf(raw, log);
const rowsOf = (changes: ReturnType<typeof cleaningChanges>) => changes.map((c) => [c.action, c.reason, c.edits, c.records]);
const paragraph = (blocks: ReturnType<typeof cleaningBlocks>) => (blocks[0] as ParagraphBlock).text;

describe('what cleaning changed, counted on the records', () => {
  it('groups the changes in effect by kind and reason and counts the records each altered', () => {
    expect(rowsOf(cleaningChanges(log, records))).toEqual([
      ['Left out', 'pond dry', 1, 2], // r1, r2
      ['Set count', 'typing slip', 1, 1], // r4
      ['Merged site name', '(no reason given)', 1, 2], // r3, r4 read "Pond  A"
      ['Set count', 'recount', 1, 1], // r7
      ['Merged site name', 'case', 1, 1], // r6
      ['Set effort', 'field card', 1, 0], // r99 is not in the import
    ]);
  });

  it('totals: records left out, edited by field, merged; entries reverted, undone, in conflict', () => {
    const totals = cleaningTotals(log, records);
    expect(totals.excluded).toBe(2);
    expect([...totals.edited]).toEqual([['count', 2], ['effort', 0]]);
    expect([...totals.merged!]).toEqual([['site', 3]]);
    expect([...totals.merges]).toEqual([['site', 2]]);
    // e1 e2 e3 e5 e6 e7 e8 in effect; e4 reverted by e5; e9 after the cursor
    expect([totals.entries, totals.inEffect, totals.reverted, totals.undone, totals.inConflict]).toEqual([9, 7, 1, 1, 2]);
  });

  it('says so in the opening paragraph and lists the conflicts', () => {
    const blocks = cleaningBlocks(log, records);
    expect(paragraph(blocks)).toBe(
      'Cleaning left 2 records out of the analysis, set or converted values in 2 records (count: 2) and merged 2 name variants of site in 3 records; each change is in the audit log with its reason (the spreadsheet holds the whole log). ' +
        'The log holds 9 entries: 7 in effect, 1 reverted, 1 undone; 2 entries are in conflict with the imported records (listed below).',
    );
    const conflicts = blocks.find((b): b is ListBlock => b.kind === 'list' && b.title === 'Changes in conflict with the records')!;
    expect(conflicts.items).toHaveLength(2);
    expect(conflicts.items[0]).toMatch(/^Edit e6 /);
    expect(conflicts.items[1]).toMatch(/^Edit e8 names record "r99"/);
  });

  it('counts a merge of a merged name with the records of both names', () => {
    const rs = [rec('a1', 'Oak', 'toad', 1), rec('a2', 'Oak.', 'toad', 2), rec('a3', 'oak', 'toad', 3)];
    const chain: EditLog = {
      entries: [
        { id: 'e1', time: t, kind: 'merge-name', field: 'site', from: 'oak', into: 'Oak.', reason: 'first pass' },
        { id: 'e2', time: t, kind: 'merge-name', field: 'site', from: 'Oak.', into: 'Oak', reason: 'second pass' },
      ],
      cursor: 2,
      nextSeq: 3,
    };
    // e1 moves a3; e2 moves a2 and (again) a3; a1 was "Oak" all along
    expect(rowsOf(cleaningChanges(chain, recordsOf(rs, chain)))).toEqual([
      ['Merged site name', 'first pass', 1, 1],
      ['Merged site name', 'second pass', 1, 2],
    ]);
    expect([...cleaningTotals(chain, recordsOf(rs, chain)).merged!]).toEqual([['site', 2]]);
  });
});

describe('what cleaning changed, from the log alone', () => {
  it('counts the records the entries name, and says a merge is not counted (not a dash)', () => {
    const changes = cleaningChanges(log);
    expect(rowsOf(changes)).toEqual([
      ['Left out', 'pond dry', 1, 2],
      ['Set count', 'typing slip', 1, 1],
      ['Merged site name', '(no reason given)', 1, null],
      ['Set count', 'recount', 1, 1],
      ['Merged site name', 'case', 1, null],
      ['Set effort', 'field card', 1, 1], // named, not checked against the import
    ]);
    const blocks = cleaningBlocks(log);
    const table = blocks.find((b): b is TableBlock => b.kind === 'table')!;
    expect(table.rows.filter((r) => r[0] === 'Merged site name').map((r) => r[3])).toEqual([NOT_COUNTED, NOT_COUNTED]);
    expect(paragraph(blocks)).toContain('merged 2 name variants of site (the records they apply to are not counted');
    expect(paragraph(blocks)).toContain('whether any is in conflict with the imported records was not checked');
  });

  it('an empty log changes nothing', () => {
    expect(paragraph(cleaningBlocks({ entries: [], cursor: 0, nextSeq: 1 }))).toMatch(/^Cleaning changed nothing/);
  });
});

describe('the same words as the screen', () => {
  const set = {
    raw,
    rawById: new Map(raw.map((r) => [r.id, r])),
    places: new Map(raw.map((r, i) => [r.id, { fileName: 'season.xlsx', sheet: 'Counts', row: 6 + i, column: 'G' }])),
  } as unknown as RecordSet;
  const byId = new Map(log.entries.map((e) => [e.id, e]));

  it('the audit log sheet names each change as the change log on the Records stage does', () => {
    const table = auditLogTable(log, records);
    const screen = log.entries.map((e) => describeOnScreen(e, set, byId).what);
    expect(table.rows.map((r) => r[3])).toEqual(screen);
    expect(screen).toEqual(['Left out', 'Set count', 'Merged site name', 'Left out', 'Reverted e4', 'Set count', 'Merged site name', 'Set effort', 'Left out']);
    expect(table.rows.map((r) => r[9])).toEqual(['in effect', 'in effect', 'in effect', 'reverted', 'in effect', 'in effect', 'in effect', 'in effect', 'undone']);
    expect(table.rows[5][10]).toMatch(/^Edit e6 expected count/);
    expect(table.rows[0][10]).toBe('');
  });

  it('the screen still says where the record sits, and what a revert cancels', () => {
    expect(describeOnScreen(log.entries[1], set, byId).where).toBe('Pond  A, frog · Counts, row 9, col. G');
    expect(describeOnScreen(log.entries[4], set, byId)).toMatchObject({ where: 'left out: Counts, row 10, col. G', old: 'left out', new: 'in the analysis', file: undefined });
    expect(describeEntry(log.entries[2])).toMatchObject({ where: 'every record named "Pond  A"', old: '"Pond  A"', new: '"Pond A"' });
  });
});

/** The planted problems table of resources/demo/README.md: one { season, kind } per row. */
function plantedProblems(): { season: string; kind: string }[] {
  const readme = readFileSync(join(__dirname, '../../resources/demo/README.md'), 'utf8');
  const block = readme.split('<!-- generated:planted -->')[1].split('<!-- /generated:planted -->')[0];
  return block
    .split('\n')
    .filter((l) => /^\| \d{4} \|/.test(l))
    .map((l) => {
      const [season, kind] = l.split('|').slice(1, 3).map((c) => c.trim());
      return { season, kind };
    });
}

/** The species count columns of the Counts sheet, from the README's "Counts header" line. */
function speciesColumnsPerRow(): number {
  const readme = readFileSync(join(__dirname, '../../resources/demo/README.md'), 'utf8');
  const header = /^Counts header \(row 5\): (.*)$/m.exec(readme)![1].split(' | ');
  return header.indexOf('Remarks') - header.indexOf('Water temp (°C)') - 1;
}

describe('the demo project: the report counts what the planted problems imply', () => {
  it('merges, exclusions and effort edits as listed in resources/demo/README.md', async () => {
    const planted = plantedProblems();
    const perRow = speciesColumnsPerRow();
    expect(perRow).toBe(4);
    const n = (kind: string) => planted.filter((p) => p.kind === kind).length;
    const variants = n('pond-name-variant');
    const duplicated = n('duplicated-row');
    const blankMinutes = n('missing-minutes');
    expect([variants, duplicated, blankMinutes]).toEqual([2, 1, 1]);

    const doc = await demoProject();
    // The command line's path: the plan a report --project run makes, records included.
    const { plan } = await projectPlan(doc, { projectFile: null, software: { name: 'Tallywise', version: 'test' }, createdAt: t });
    expect(plan.cleaningRecords).toBeDefined();
    const totals = cleaningTotals(plan.cleaning!, plan.cleaningRecords);
    // One record per species on each visit row: a repeated row left out, the blank minutes set on each record of its row,
    // each name variant merged on the records of its row; the other planted problems are left as the import reads them.
    expect(totals.excluded).toBe(duplicated * perRow);
    expect([...totals.edited]).toEqual([['effort', blankMinutes * perRow]]);
    expect([...totals.merges]).toEqual([['site', variants]]);
    expect([...totals.merged!]).toEqual([['site', variants * perRow]]);
    // one entry per merge, one per exclusion, one per record of the blank minutes
    expect([totals.entries, totals.inEffect, totals.reverted, totals.undone, totals.inConflict]).toEqual([variants + duplicated + blankMinutes * perRow, variants + duplicated + blankMinutes * perRow, 0, 0, 0]);
    expect(paragraph(cleaningBlocks(plan.cleaning!, plan.cleaningRecords))).toBe(
      `Cleaning left ${duplicated * perRow} records out of the analysis, set or converted values in ${blankMinutes * perRow} records (effort: ${blankMinutes * perRow}) and merged ${variants} name variants of site in ${variants * perRow} records; each change is in the audit log with its reason (the spreadsheet holds the whole log). ` +
        `The log holds ${totals.entries} entries: ${totals.entries} in effect, none reverted, none undone; none is in conflict with the imported records.`,
    );
  });
});
