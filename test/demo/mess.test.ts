import { describe, expect, it } from 'vitest';
import { buildDemo } from '@shared/demo/build';
import { MESS_PLAN, plantMess } from '@shared/demo/mess';
import { COLUMN, COUNTS_SHEET, FIRST_DATA_ROW, countsDraft, seasonFileName } from '@shared/demo/season-sheet';
import { cellText, columnLetter, isDateCell } from '@shared/demo/sheet-grid';
import { DEFAULT_DEMO_SEED, seasonsOf } from '@shared/demo/truth';

const demo = buildDemo(DEFAULT_DEMO_SEED);
const sim = demo.simulation;
const cleanDrafts = seasonsOf(sim.truth).map((s) => countsDraft(sim, s));
const countsGrid = (season: number) => demo.workbooks.find((w) => w.season === season)!.sheets.find((s) => s.name === COUNTS_SHEET)!;
const columnNumber = (letter: string) => [...letter].reduce((n, ch) => n * 26 + ch.charCodeAt(0) - 64, 0);

describe('planted problems: the record matches the plan and the sheets', () => {
  it('plants exactly the planned kinds in the planned seasons', () => {
    const key = (p: { season: number; kind: string }) => `${p.season} ${p.kind}`;
    expect(demo.planted.map(key).sort()).toEqual(MESS_PLAN.map(key).sort());
    const kinds = new Set(demo.planted.map((p) => p.kind));
    for (const k of ['not-surveyed-code', 'present-not-counted-code', 'at-least-code', 'pond-name-variant', 'duplicated-row', 'missing-minutes', 'count-as-text', 'date-as-text']) expect(kinds).toContain(k);
  });

  it('names file, sheet, row, column and header consistently, and never plants twice in one cell', () => {
    const cells = new Set<string>();
    for (const p of demo.planted) {
      expect(p.file).toBe(seasonFileName(p.season));
      expect(p.sheet).toBe(COUNTS_SHEET);
      expect(p.row).toBeGreaterThanOrEqual(FIRST_DATA_ROW);
      expect(countsGrid(p.season).rows[FIRST_DATA_ROW - 2][columnNumber(p.column) - 1]).toBe(p.header);
      expect(p.note.length).toBeGreaterThan(20);
      cells.add(`${p.season}!${p.column}${p.row}`);
    }
    expect(cells.size).toBe(demo.planted.length);
  });

  it('the recorded cell holds what the record says was written', () => {
    for (const p of demo.planted) {
      const cell = countsGrid(p.season).rows[p.row - 1][columnNumber(p.column) - 1];
      expect(cellText(cell)).toBe(p.found);
      if (p.kind === 'missing-minutes') expect(cell).toBeNull();
      else if (p.kind !== 'duplicated-row') expect(typeof cell).toBe('string');
    }
  });

  it('the clean value is the simulated truth at that place', () => {
    const byKind = (k: string) => demo.planted.filter((p) => p.kind === k);
    for (const p of demo.planted) {
      const draft = cleanDrafts.find((d) => d.season === p.season)!;
      const dup = demo.planted.find((q) => q.kind === 'duplicated-row' && q.season === p.season);
      // Rows below an inserted duplicate sit one lower than in the clean draft.
      const index = p.row - FIRST_DATA_ROW - (dup && p.kind !== 'duplicated-row' && p.row > dup.row ? 1 : 0);
      const visit = draft.visitOf[p.kind === 'duplicated-row' ? index - 1 : index];
      const col = columnNumber(p.column);
      if (col >= COLUMN.firstSpecies) expect(p.cleanValue).toBe(visit.counts[col - COLUMN.firstSpecies]);
      if (p.kind === 'missing-minutes') expect(p.cleanValue).toBe(visit.minutes);
      if (p.kind === 'date-as-text') expect(p.cleanValue).toBe(visit.date);
      if (p.kind === 'pond-name-variant') {
        expect(p.cleanValue).toBe(visit.pond);
        expect(p.found).not.toBe(visit.pond);
      }
    }
    for (const p of byKind('present-not-counted-code')) expect(p.cleanValue as number).toBeGreaterThan(0);
    for (const p of byKind('count-as-text')) expect(p.found.trim()).toBe(String(p.cleanValue));
    const [atLeast] = byKind('at-least-code');
    expect(atLeast.found).toMatch(/^>\d+$/);
    expect(atLeast.cleanValue as number).toBeGreaterThan(Number(atLeast.found.slice(1)));
  });

  it('pond name variants: one in case and spacing, one a typo, both close to the real name', () => {
    const variants = demo.planted.filter((p) => p.kind === 'pond-name-variant');
    expect(variants).toHaveLength(2);
    expect(variants.some((p) => p.found.endsWith(' ') && p.found.trim().toLowerCase() === String(p.cleanValue).toLowerCase())).toBe(true);
    expect(variants.some((p) => p.found.length === String(p.cleanValue).length - 1 && p.found === p.found.trim())).toBe(true);
  });

  it('the duplicated row repeats the row above it exactly', () => {
    const dup = demo.planted.find((p) => p.kind === 'duplicated-row')!;
    const rows = countsGrid(dup.season).rows;
    expect(rows[dup.row - 1]).toEqual(rows[dup.row - 2]);
    expect(dup.cleanValue).toBeNull();
  });

  it('leaves the other seasons clean and does not change its input', () => {
    const before = JSON.stringify(cleanDrafts);
    const { drafts } = plantMess(cleanDrafts, DEFAULT_DEMO_SEED);
    expect(JSON.stringify(cleanDrafts)).toBe(before);
    const messySeasons = new Set(MESS_PLAN.map((s) => s.season));
    for (const d of drafts) {
      const clean = cleanDrafts.find((c) => c.season === d.season)!;
      if (messySeasons.has(d.season)) expect(d.rows).not.toEqual(clean.rows);
      else expect(d.rows).toEqual(clean.rows);
    }
    expect(messySeasons.size).toBeLessThanOrEqual(6);
  });

  it('clean sheets hold real dates and numbers only', () => {
    const clean = cleanDrafts.find((d) => !MESS_PLAN.some((s) => s.season === d.season))!;
    for (const row of clean.rows) {
      expect(isDateCell(row[COLUMN.date - 1])).toBe(true);
      for (let c: number = COLUMN.visit; c < COLUMN.firstSpecies + sim.truth.species.length; c++) if (c !== COLUMN.observer) expect(typeof row[c - 1]).toBe('number');
    }
  });

  it('is reproducible for a seed; another seed moves the problems but keeps their kinds', () => {
    expect(buildDemo(DEFAULT_DEMO_SEED).planted).toEqual(demo.planted);
    const other = buildDemo(DEFAULT_DEMO_SEED + 99).planted;
    expect(other.map((p) => p.kind)).toEqual(demo.planted.map((p) => p.kind));
    expect(other.map((p) => `${p.column}${p.row}`)).not.toEqual(demo.planted.map((p) => `${p.column}${p.row}`));
  });

  it('column letters follow the spreadsheet convention (common practice)', () => {
    expect([1, 26, 27, 52, 703].map(columnLetter)).toEqual(['A', 'Z', 'AA', 'AZ', 'AAA']);
  });
});
