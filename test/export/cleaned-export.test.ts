import { beforeAll, describe, expect, it } from 'vitest';
import { sheetOf, type ExportSheet } from '@shared/export/export-model';
import { analysisHeader } from '@shared/export/analysis-sheet';
import { EXPORT_CAUTION } from '@shared/export/about-sheet';
import { recordsOfSource } from '@shared/analysis/loaded-records';
import { demoExport, EXPORTED_AT, type DemoExport } from './demo-export';

// The cleaned-data export of the demo project (invented, simulated data)
// with one more cell edit: its tables against the cleaned records and the
// analysis table the model builder is given (CleanedAnalysis.analysis.table,
// what the Models stage fits).

let d: DemoExport;
beforeAll(async () => {
  d = await demoExport();
}, 120_000);

const col = (s: ExportSheet, header: string) => {
  const j = s.table.columns.findIndex((c) => c.header === header);
  if (j < 0) throw new Error(`no column "${header}" in ${s.name}`);
  return j;
};
const about = (label: string) => sheetOf(d.exported, 'about').table.rows.find((r) => r[0] === label);

describe('cleaned-data export of the demo', () => {
  it('has the four tables in order, and nothing that is not finite', () => {
    expect(d.exported.sheets.map((s) => s.name)).toEqual(['Records', 'Analysis table', 'Changes', 'About']);
    for (const s of d.exported.sheets) {
      for (const r of s.table.rows) {
        expect(r).toHaveLength(s.table.columns.length);
        for (const c of r) if (typeof c === 'number') expect(Number.isFinite(c)).toBe(true);
        for (const c of r) expect(c).not.toBe('');
      }
    }
  });

  it('Records: one row per cleaned record; kept and left out match the records', () => {
    const rec = sheetOf(d.exported, 'records');
    expect(rec.table.rows).toHaveLength(d.analysis.cleaned.length);
    const leftOut = d.analysis.cleaned.filter((r) => r.excluded !== undefined);
    // The demo's recorded cleaning leaves out the planted duplicated rows (src-main/demo/demo-project.ts), so some are left out.
    expect(leftOut.length).toBeGreaterThan(0);
    const j = col(rec, 'Left out');
    expect(rec.table.rows.filter((r) => r[j] === 'yes')).toHaveLength(leftOut.length);
    expect(about('Records left out')?.[1]).toBe(leftOut.length);
    expect(about('Records kept')?.[1]).toBe(d.analysis.cleaned.length - leftOut.length);
    expect(d.exported.counts).toEqual({ records: d.analysis.cleaned.length, kept: d.analysis.cleaned.length - leftOut.length, leftOut: leftOut.length, analysisRows: d.analysis.analysis.table.nrows });
    // Every left-out row carries its reason ("Visit entered twice: ... repeats row ...").
    const why = col(rec, 'Why left out');
    for (const r of rec.table.rows.filter((x) => x[j] === 'yes')) expect(r[why]).toMatch(/Visit entered twice/);
  });

  it('Records: the edited count shows as used, the cell text as read, at its place in the workbook', () => {
    const rec = sheetOf(d.exported, 'records');
    const s = d.sources.find((x) => d.edited.id.startsWith(`${x.summary.id}:`))!;
    const u = recordsOfSource(s);
    const i = u.raw.findIndex((r) => r.id === d.edited.id);
    const row = rec.table.rows.find((r) => r[col(rec, 'File')] === s.summary.fileName && r[col(rec, 'Row')] === u.row[i] && r[col(rec, 'Count cell')] === u.column[i])!;
    expect(row).toBeDefined();
    // Hand-check: a plain number cell reads as its own digits (count 3 -> "3"); the edit adds 7.
    expect(row[col(rec, 'Count as read (cell text)')]).toBe(String(d.editedFrom));
    expect(row[col(rec, 'Count used')]).toBe(d.editedTo);
    expect(row[col(rec, 'Status')]).toBe('counted');
    expect(row[col(rec, 'Site')]).toBe(String(d.edited.fields.site).trim());
    // Seasons and visits read as numbers stay numbers (the demo's first record: season 2012, visit 1).
    expect(row[col(rec, 'Season')]).toBe(Number(d.edited.fields.season));
    expect(typeof row[col(rec, 'Visit')]).toBe('number');
  });

  it('Records: open flags in the Records stage words; a finding dealt with by leaving out is not listed', () => {
    const rec = sheetOf(d.exported, 'records');
    const flags = col(rec, 'Open flags');
    const placeOf = (id: string) => {
      const s = d.sources.find((x) => id.startsWith(`${x.summary.id}:`))!;
      const u = recordsOfSource(s);
      const i = u.raw.findIndex((r) => r.id === id);
      return rec.table.rows.find((r) => r[col(rec, 'File')] === s.summary.fileName && r[col(rec, 'Row')] === u.row[i] && r[col(rec, 'Count cell')] === u.column[i])!;
    };
    const findings = d.sources.flatMap((s) => s.findings);
    const rawOf = (id: string) => d.sources.flatMap((x) => recordsOfSource(x).raw).find((r) => r.id === id)!;
    const cleanedOf = (id: string) => d.analysis.cleaned.find((r) => r.id === id)!;
    // The words the Records stage's chips use for the demo's planted problems (src-shared/cleaning/finding-flags.ts).
    const words: Record<string, string> = { 'count-lower-bound': 'lower bound', 'count-present-only': 'heard, no count', 'count-not-surveyed': 'not surveyed', 'effort-missing': 'no effort', 'date-as-text': 'date as text' };
    let open = 0;
    let settled = 0;
    for (const f of findings.filter((x) => x.field && words[x.code])) {
      for (const id of f.recordIds) {
        const c = cleanedOf(id);
        if (c.excluded !== undefined) continue;
        const untouched = c.fields[f.field!] === rawOf(id).fields[f.field!];
        // Still as imported: the flag is open; edited by the recorded cleaning: dealt with, not listed.
        if (untouched) open++;
        else settled++;
        const listed = String(placeOf(id)[flags] ?? '');
        if (untouched) expect(listed, `${f.code} on ${id}`).toContain(words[f.code]);
        else expect(listed, `${f.code} on ${id}`).not.toContain(words[f.code]);
      }
    }
    expect(open).toBeGreaterThan(0);
    expect(settled).toBeGreaterThan(0);
    expect(rec.table.rows.some((r) => /effort-missing|count-lower-bound/.test(String(r[flags] ?? '')))).toBe(false);
    // The planted repeated rows are left out by the recorded cleaning: their "repeated row" flag is dealt with.
    const repeated = findings.filter((f) => f.code === 'repeated-visit').flatMap((f) => f.recordIds);
    const leftOut = repeated.filter((id) => d.analysis.cleaned.find((r) => r.id === id)?.excluded !== undefined);
    expect(leftOut.length).toBeGreaterThan(0);
    for (const id of leftOut) expect(String(placeOf(id)[flags] ?? '')).not.toContain('repeated row');
  });

  it('Analysis table: the same rows and numbers the model builder gets, units in the headers', () => {
    const t = d.analysis.analysis.table;
    const sheet = sheetOf(d.exported, 'analysis');
    expect(sheet.table.rows).toHaveLength(t.nrows);
    expect(sheet.table.columns.map((c) => c.header)).toEqual(t.columns.map((c) => analysisHeader(c.name, d.analysis.analysis.effortColumn)));
    // The demo's effort is listening minutes, put in hours by the import (src-shared/import/units.ts): effort_h.
    expect(sheet.table.columns.map((c) => c.header)).toContain('effort_h (hours)');
    expect(sheet.table.columns.map((c) => c.header)).toContain('area_ha (hectares)');
    t.columns.forEach((c, j) => {
      const got = sheet.table.rows.map((r) => r[j]);
      if (c.numeric && c.name !== 'site' && c.name !== 'species') expect(got).toEqual(Array.from(c.values, (v, k) => (c.texts[k] === '' || !Number.isFinite(v) ? null : v)));
      else expect(got).toEqual(c.texts.map((x) => (x === '' ? null : x)));
    });
    // The edit raised one record by 7, so its site x season x species row sums 7 more than before the edit.
    const e = d.edited.fields;
    const row = sheet.table.rows.find((r) => r[0] === String(e.site).trim() && String(r[1]) === String(e.season).trim() && r[2] === String(e.species).trim())!;
    expect(row[col(sheet, analysisHeader('count', d.analysis.analysis.effortColumn))]).toBe(d.rowCountBefore + 7);
  });

  it('Analysis table: the offsets are natural logs of effort (hours) and area (ha), their sum in offset', () => {
    // Hand-checked on the demo's first row (Alder Carr Pond 2012): three visits totalling 35 minutes = 0.5833 h,
    // ln(0.5833) = -0.5390; area 0.064 ha, ln(0.064) = -2.7489; offset -3.2879 (common practice: log offsets).
    const sheet = sheetOf(d.exported, 'analysis');
    const h = (n: string) => col(sheet, analysisHeader(n, d.analysis.analysis.effortColumn));
    for (const r of sheet.table.rows.slice(0, 50)) {
      expect(r[h('log_effort')] as number).toBeCloseTo(Math.log(r[h('effort_h')] as number), 12);
      expect(r[h('log_area')] as number).toBeCloseTo(Math.log(r[h('area_ha')] as number), 12);
      expect(r[h('offset')] as number).toBeCloseTo((r[h('log_effort')] as number) + (r[h('log_area')] as number), 12);
    }
  });

  it('Changes: every log entry, the new edit last in the Records stage words', () => {
    const ch = sheetOf(d.exported, 'changes');
    expect(ch.table.rows.map((r) => r[0])).toEqual(d.log.entries.map((e) => e.id));
    const last = ch.table.rows.at(-1)!;
    expect(last[col(ch, 'What')]).toBe('Set count');
    expect(last[col(ch, 'From')]).toBe(String(d.editedFrom));
    expect(last[col(ch, 'To')]).toBe(String(d.editedTo));
    expect(last[col(ch, 'Reason')]).toBe('field card reads 7 more');
    expect(last[col(ch, 'Status')]).toBe('in effect');
    expect(last[col(ch, 'Where')]).toMatch(/row \d+, col\. [A-Z]+$/);
  });

  it('About: sources with their SHA-256, the unsaved note, the rule and the caution', () => {
    const sources = sheetOf(d.exported, 'about').table.rows.filter((r) => r[0] === 'Source file');
    expect(sources.map((r) => r[1])).toEqual(d.sources.map((s) => s.summary.fileName));
    for (const [k, r] of sources.entries()) expect(r[2]).toContain(`SHA-256 ${d.sources[k].summary.sha256}`);
    expect(d.sources[0].summary.sha256).toMatch(/^[0-9a-f]{64}$/);
    expect(about('Project')?.[2]).toMatch(/not yet saved/);
    expect(about('Exported')?.[1]).toBe(EXPORTED_AT);
    expect(about('Aggregation rule')?.[1]).toMatch(/summed/);
    expect(about('Caution')?.[1]).toBe(EXPORT_CAUTION);
    expect(EXPORT_CAUTION).toMatch(/detection/);
  });
});
