import { beforeAll, describe, expect, it } from 'vitest';
import { appendEdit } from '@shared/cleaning/edit-log';
import { parseProjectDocument, type ProjectDocument } from '@shared/project/document';
import type { ReportHistoryEntry, ReportRecord } from '@shared/project/report-history';
import { historyEntry } from '@shared/report/history-record';
import type { ListBlock, ParagraphBlock, ReportDocument, TableBlock } from '@shared/report/model';
import { formatNumber, signedPercent } from '@shared/report/number-format';
import { runProgrammeReport, type ProgrammeRun } from '@shared/report/programme-report';
import { compareWithLast } from '@shared/report/since-last';
import { sinceLastSection } from '@shared/report/since-last-section';
import { demoProject } from '../../src-main/demo/demo-project';
import { projectAnalysis } from '../../src-main/project/project-analysis';
import { projectPlan } from '../../src-main/report/project-report';

// The report history of the demo project (our invented, simulated
// scenario): the entry a report leaves, the same project reported again
// ("reproduced exactly"), and the project with one count corrected in its
// cleaning log. The numbers the section and its sheet show are checked
// against the two runs' own results, worked out here from the records.

const SPECIES = ['Common toad', 'Pool frog'];
const files = [
  { name: 'r.pdf', sha256: '01'.repeat(32) },
  { name: 'r.html', sha256: '02'.repeat(32) },
  { name: 'r.xlsx', sha256: '03'.repeat(32) },
];

async function report(doc: ProjectDocument, createdAt: string): Promise<ProgrammeRun> {
  const { plan } = await projectPlan(doc, { species: SPECIES, projectFile: null, software: { name: 'Tallywise', version: 'test' }, createdAt, replicates: 20 });
  return runProgrammeReport(plan);
}

const section = (d: ReportDocument) => d.sections.find((s) => s.id === 'since-last');
const lead = (d: ReportDocument) => (section(d)!.blocks[0] as ParagraphBlock).text;

let doc: ProjectDocument;
let first: ProgrammeRun;
let entry: ReportHistoryEntry;

beforeAll(async () => {
  doc = await demoProject();
  first = await report(doc, '2026-03-01T10:00:00.000Z');
  entry = historyEntry(first.record, files);
}, 300_000);

describe('the history entry of a report of the demo project', () => {
  it('holds the run, the data key, each species model and the numbers of the report, and fits the project schema', async () => {
    const analysis = await projectAnalysis(doc);
    expect(entry.madeAt).toBe('2026-03-01T10:00:00.000Z');
    expect(entry.software).toEqual({ name: 'Tallywise', version: 'test' });
    expect(entry.files).toEqual(files);
    expect(entry.dataKey).toBe(analysis.dataKey);
    expect(entry.species.map((s) => s.species)).toEqual(SPECIES);
    for (const s of entry.species) {
      const chosen = doc.models.find((m) => m.species === s.species && m.chosen)!;
      expect(s.model).toEqual({ name: chosen.name, spec: chosen.spec, dropBadOffsetRows: chosen.dropBadOffsetRows });
      // The same numbers as the report's own tables: the index table of the species' section and its summary row.
      const sec = first.document.sections.find((x) => x.heading === s.species)!;
      const table = sec.blocks.find((b): b is TableBlock => b.kind === 'table' && b.id.endsWith('-indices'))!;
      expect(s.result!.indices.map((r) => [r.season, r.index, r.lower, r.upper])).toEqual(table.rows);
      const summary = first.document.sheets.find((x) => x.name === 'Trend summary')!.table.rows.find((r) => r[0] === s.species)!;
      expect([s.result!.trend.perSeason, s.result!.trend.lower, s.result!.trend.upper]).toEqual(summary.slice(1, 4));
      expect(s.result!.aic).toBeGreaterThan(0);
      expect(s.result!.theta).toBeGreaterThan(0);
    }
    const compositeRows = first.document.sheets.find((x) => x.name === 'Composite')!.table.rows;
    expect(entry.composite!.indices.map((r) => [r.season, r.index, r.lower, r.upper])).toEqual(compositeRows);
    expect(entry.composite!.replicates).toBe(20);
    // Small: no per-record data (a few kilobytes for two species).
    expect(JSON.stringify(entry).length).toBeLessThan(12_000);
    const saved = parseProjectDocument({ ...doc, reportHistory: [entry] });
    expect(saved.reportHistory).toEqual([entry]);
  });

  it('a first report has no section "Since the last report"', () => {
    expect(first.sinceLast).toBeNull();
    expect(section(first.document)).toBeUndefined();
  });
});

describe('the same project reported again', () => {
  let again: ProgrammeRun;
  beforeAll(async () => {
    const { plan } = await projectPlan({ ...doc, reportHistory: [entry] }, { species: SPECIES, projectFile: null, software: { name: 'Tallywise', version: 'test' }, createdAt: '2026-03-02T10:00:00.000Z', replicates: 20 });
    again = await runProgrammeReport(plan);
  }, 300_000);

  it('says "reproduced exactly" in the section placed after the summary, and in the workbook', () => {
    expect(again.sinceLast!.verdict).toBe('exact');
    expect(again.sinceLast!.differences).toEqual([]);
    const ids = again.document.sections.map((s) => s.id);
    expect(ids.indexOf('since-last')).toBe(ids.indexOf('summary') + 1);
    expect(lead(again.document)).toMatch(/^The last report was made on 2026-03-01 10:00 UTC with Tallywise test\..*reproduced exactly\.$/);
    const sheet = again.document.sheets.find((s) => s.name === 'Since last report')!.table;
    expect(sheet.rows.length).toBeGreaterThan(0);
    for (const r of sheet.rows) if (typeof r[3] === 'number') expect(r[5]).toBe(0);
  });

  it('a stored number tampered with is named, by species and quantity', () => {
    const tampered: ReportHistoryEntry = structuredClone(entry);
    tampered.species[1].result!.aic! += 0.5;
    tampered.species[0].result!.indices[3].upper! *= 1.01;
    const s = compareWithLast(tampered, again.record);
    expect(s.verdict).toBe('differs');
    expect(s.differences.map((d) => [d.subject, d.quantity])).toEqual([
      ['Common toad', `upper limit of index ${entry.species[0].result!.indices[3].season}`],
      ['Pool frog', 'AIC'],
    ]);
    expect(s.differences[1]).toMatchObject({ then: entry.species[1].result!.aic! + 0.5, now: entry.species[1].result!.aic });
    const caution = sinceLastSection(s).blocks.find((b) => b.kind === 'caution')!;
    expect(caution.kind === 'caution' && caution.items[1]).toBe(`Pool frog: AIC was ${entry.species[1].result!.aic! + 0.5}, is ${entry.species[1].result!.aic}`);
  });

  it('a difference below one part in a billion is rounding, not a different result', () => {
    const near: ReportHistoryEntry = structuredClone(entry);
    near.species[0].result!.trend.perSeason! *= 1 + 1e-12;
    expect(compareWithLast(near, again.record).verdict).toBe('rounding');
  });

  it('another model for a species is a change of the inputs, and the other species are still checked', () => {
    const other: ReportRecord = structuredClone(again.record);
    other.species[0].model.spec = { ...other.species[0].model.spec, distribution: 'poisson' };
    const s = compareWithLast(entry, other);
    expect(s.verdict).toBe('models-changed');
    expect(s.changes.join(' ')).toMatch(/The model of Common toad changed/);
    other.species[1].result!.theta! *= 2;
    expect(compareWithLast(entry, other).differences.map((d) => [d.subject, d.quantity])).toEqual([['Pool frog', 'theta']]);
  });
});

describe('the project with one count corrected in its cleaning log', () => {
  let changed: ProgrammeRun;
  let corrected: { season: string; old: number; now: number };
  beforeAll(async () => {
    const analysis = await projectAnalysis(doc);
    // A Pool frog record with a count, in the fourth season: its count made four times larger (plus 5).
    const rec = analysis.cleaned.find((r) => !r.excluded && r.fields.species === 'Pool frog' && typeof r.fields.count === 'number' && (r.fields.count as number) > 0 && String(r.fields.season ?? r.fields.date ?? '').length > 0)!;
    const old = rec.fields.count as number;
    corrected = { season: String(rec.fields.season ?? rec.fields.date), old, now: old * 4 + 5 };
    const cleaning = appendEdit(doc.cleaning, { kind: 'set-value', recordId: rec.id, field: 'count', old, new: corrected.now, reason: 'test: a count corrected' }, () => new Date('2026-03-03T00:00:00.000Z'));
    const { plan } = await projectPlan({ ...doc, cleaning, reportHistory: [entry] }, { species: SPECIES, projectFile: null, software: { name: 'Tallywise', version: 'test' }, createdAt: '2026-03-04T10:00:00.000Z', replicates: 20 });
    changed = await runProgrammeReport(plan);
  }, 300_000);

  it('says the records changed, so numbers are expected to move, and why earlier indices move', () => {
    const s = changed.sinceLast!;
    expect(s.verdict).toBe('data-changed');
    expect(changed.record.dataKey).not.toBe(entry.dataKey);
    expect(lead(changed.document)).toMatch(/Since then the cleaned records changed, so the numbers are expected to move/);
    const blocks = section(changed.document)!.blocks;
    expect((blocks.find((b) => b.kind === 'list') as ListBlock).items).toContain('The cleaned records changed (records imported, corrected or left out).');
    expect(blocks.some((b) => b.kind === 'paragraph' && /Indices of seasons already reported move when a season is added or records are corrected/.test(b.text))).toBe(true);
  });

  it("gives each species' trend then and now and its largest index change, as worked out from the two runs", () => {
    const table = section(changed.document)!.blocks.find((b): b is TableBlock => b.kind === 'table')!;
    for (const [k, name] of SPECIES.entries()) {
      const then = entry.species[k].result!;
      const now = changed.record.species[k].result!;
      // By hand: the season whose index moved most, over the seasons both runs have.
      let best = { season: '' as number | string, d: -1, a: 0, b: 0 };
      for (const r of now.indices) {
        const t = then.indices.find((x) => x.season === r.season)!;
        const d = Math.abs(r.index! - t.index!);
        if (d > best.d) best = { season: r.season, d, a: t.index!, b: r.index! };
      }
      const row = table.rows.find((r) => r[0] === name)!;
      const trend = (x: typeof then) => `${signedPercent(x.trend.perSeason!)} (${signedPercent(x.trend.lower!)} to ${signedPercent(x.trend.upper!)})`;
      expect(row[2]).toBe(trend(then));
      expect(row[4]).toBe(trend(now));
      const diff = best.b - best.a;
      if (best.d === 0) expect(row[5]).toBe('none moved');
      else expect(row[5]).toBe(`${best.season}: ${formatNumber(best.a, { kind: 'fixed', decimals: 1 })} then, ${formatNumber(best.b, { kind: 'fixed', decimals: 1 })} now (${diff >= 0 ? '+' : ''}${formatNumber(diff, { kind: 'fixed', decimals: 1 })})`);
      expect(row[1]).toBe(`${then.indices[0].season}–${then.indices.at(-1)!.season} (${then.indices.length})`);
    }
    // The corrected species moved, the other (fitted on its own) did not.
    expect(table.rows.find((r) => r[0] === 'Common toad')![5]).toBe('none moved');
    const frogThen = entry.species[1].result!.indices;
    const frogNow = changed.record.species[1].result!.indices;
    expect(frogNow.some((r, i) => r.index !== frogThen[i].index)).toBe(true);
  });

  it('the workbook sheet lists every number then and now with its change (the difference list)', () => {
    const sheet = changed.document.sheets.find((s) => s.name === 'Since last report')!.table;
    const then = entry.species[1].result!;
    const now = changed.record.species[1].result!;
    const row = sheet.rows.find((r) => r[0] === 'Pool frog' && r[1] === 'trend a season')!;
    expect(row.slice(3)).toEqual([then.trend.perSeason, now.trend.perSeason, now.trend.perSeason! - then.trend.perSeason!]);
    const moved = sheet.rows.filter((r) => r[0] === 'Pool frog' && r[1] === 'index' && r[5] !== 0);
    expect(moved.length).toBeGreaterThan(0);
    for (const r of moved) {
      const t = then.indices.find((x) => x.season === r[2])!;
      const n = now.indices.find((x) => x.season === r[2])!;
      expect(r.slice(3)).toEqual([t.index, n.index, n.index! - t.index!]);
    }
  });
});
