import { mkdtemp, readFile, rm } from 'node:fs/promises';
import { readFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { DemoWriteError, writeDemoCsv, writeDemoWorkbooks, type DemoWorkbooksResult } from '../../src-main/demo/write-workbooks';
import { ANALYSIS_COLUMNS } from '@shared/demo/analysis-table';
import { buildDemo } from '@shared/demo/build';
import { PONDS, PROGRAMME_SLUG } from '@shared/demo/programme';
import { isDateCell, type SheetCell } from '@shared/demo/sheet-grid';
import { simulateDemo } from '@shared/demo/simulate';
import { DEFAULT_DEMO_SEED, seasonsOf } from '@shared/demo/truth';

const README = readFileSync(join(__dirname, '../../resources/demo/README.md'), 'utf8');
const demo = buildDemo(DEFAULT_DEMO_SEED);
let dir = '';
let result: DemoWorkbooksResult;
const books = new Map<number, ExcelJS.Workbook>();

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tw-demo-'));
  result = await writeDemoWorkbooks(dir, { seed: DEFAULT_DEMO_SEED });
  for (const file of result.files) {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(file);
    books.set(Number(/-(\d{4})\.xlsx$/.exec(file)![1]), wb);
  }
});

afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

/** The header a README line "<Sheet> header (row N): A | B | …" states. */
function readmeHeader(sheet: string): { row: number; names: string[] } {
  const m = new RegExp(`^${sheet} header \\(row (\\d+)\\): (.+)$`, 'm').exec(README);
  if (!m) throw new Error(`README has no "${sheet} header (row N): …" line`);
  return { row: Number(m[1]), names: m[2].split('|').map((s) => s.trim()) };
}

function rowTexts(ws: ExcelJS.Worksheet, row: number): string[] {
  const out: string[] = [];
  ws.getRow(row).eachCell({ includeEmpty: false }, (cell, col) => {
    out[col - 1] = String(cell.value);
  });
  return out;
}

/** The value exceljs reads back for a grid cell. */
function expectedValue(cell: SheetCell): unknown {
  if (cell === null) return null;
  if (isDateCell(cell)) return new Date(`${cell.date}T00:00:00.000Z`);
  return cell;
}

describe('demo season workbooks on disk', () => {
  it('writes one workbook per season named <slug>-<season>.xlsx', () => {
    expect(result.files.map((f) => basename(f))).toEqual(seasonsOf(demo.simulation.truth).map((s) => `${PROGRAMME_SLUG}-${s}.xlsx`));
    expect(result.planted).toEqual(demo.planted);
  });

  it('has the layout the README states: sheets, title rows, header row, data rows, closing note', () => {
    const counts = readmeHeader('Counts');
    const ponds = readmeHeader('Ponds');
    expect(README).toMatch(/Row 6 onwards: one row per pond visit/);
    for (const [season, wb] of books) {
      expect(wb.worksheets.map((w) => w.name)).toEqual(['Counts', 'Ponds']);
      const ws = wb.getWorksheet('Counts')!;
      expect(String(ws.getCell(1, 1).value)).toContain(String(season));
      expect(String(ws.getCell(2, 1).value)).toMatch(/NS = not surveyed.*x = present but not counted.*>N = more than N/);
      expect(ws.getRow(4).cellCount).toBe(0);
      expect(rowTexts(ws, counts.row)).toEqual(counts.names);
      const visits = demo.simulation.visits.filter((v) => v.season === season).length;
      const dups = demo.planted.filter((p) => p.season === season && p.kind === 'duplicated-row').length;
      const lastData = counts.row + visits + dups;
      expect(ws.getCell(lastData, 1).value).not.toBeNull();
      expect(ws.getRow(lastData + 1).cellCount).toBe(0);
      expect(String(ws.getCell(lastData + 2, 1).value)).toMatch(/^End of/);
      expect(ws.rowCount).toBe(lastData + 2);
      const pw = wb.getWorksheet('Ponds')!;
      expect(rowTexts(pw, ponds.row)).toEqual(ponds.names);
      expect(pw.rowCount).toBe(ponds.row + PONDS.length);
      expect(pw.getCell(ponds.row + 1, 1).value).toBe(PONDS[0].name);
      expect(pw.getCell(ponds.row + 1, 2).value).toBe(PONDS[0].areaM2);
    }
  });

  it('holds every planted problem at the recorded sheet, row and column', () => {
    for (const p of result.planted) {
      const cell = books.get(p.season)!.getWorksheet(p.sheet)!.getCell(`${p.column}${p.row}`);
      if (p.found === '') expect(cell.value).toBeNull();
      else expect(String(cell.value)).toBe(p.found);
      // Codes, text counts, typed dates and name variants are text cells, as a person typed them.
      if (p.kind !== 'missing-minutes' && p.kind !== 'duplicated-row') expect(cell.type).toBe(ExcelJS.ValueType.String);
    }
  });

  it('writes every other cell as the grid has it: real dates, numbers and texts', () => {
    for (const book of demo.workbooks) {
      const wb = books.get(book.season)!;
      for (const grid of book.sheets) {
        const ws = wb.getWorksheet(grid.name)!;
        grid.rows.forEach((cells, r) => {
          cells.forEach((cell, c) => {
            expect(ws.getCell(r + 1, c + 1).value).toEqual(expectedValue(cell));
          });
        });
      }
    }
    const dateCell = books.get(2012)!.getWorksheet('Counts')!.getCell('B6');
    expect(dateCell.type).toBe(ExcelJS.ValueType.Date);
    expect(dateCell.numFmt).toBe('dd/mm/yyyy');
  });

  it('gives the same problems for the same seed and different ones for another seed', async () => {
    const other = await mkdtemp(join(tmpdir(), 'tw-demo-'));
    try {
      const again = await writeDemoWorkbooks(other, { seed: DEFAULT_DEMO_SEED + 5 });
      expect(again.files).toHaveLength(result.files.length);
      expect(again.planted.map((p) => `${p.season}${p.column}${p.row}`)).not.toEqual(result.planted.map((p) => `${p.season}${p.column}${p.row}`));
    } finally {
      await rm(other, { recursive: true, force: true });
    }
  });
});

describe('demo writer: bad input gets a plain message', () => {
  it('names the file it could not write and what to do', async () => {
    const blocker = join(dir, 'not-a-folder');
    writeDemoCsv({ outFile: blocker });
    const err = await writeDemoWorkbooks(join(blocker, 'out')).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(DemoWriteError);
    expect((err as Error).message).toContain(join(blocker, 'out'));
    expect((err as Error).message).toMatch(/Choose a folder you can write to/);
    expect(() => writeDemoCsv({ outFile: join(blocker, 'x.csv') })).toThrow(DemoWriteError);
  });

  it('refuses a seed that is not a whole number', async () => {
    await expect(writeDemoWorkbooks(dir, { seed: 1.5 })).rejects.toThrow(/whole number/);
    expect(() => writeDemoCsv({ seed: -1 })).toThrow(/whole number/);
  });
});

describe('clean analysis table as CSV', () => {
  it('has the documented columns and the season sums of the simulation', async () => {
    const file = join(dir, 'clean.csv');
    const text = writeDemoCsv({ seed: DEFAULT_DEMO_SEED, outFile: file });
    expect(await readFile(file, 'utf8')).toBe(text);
    const parsed = Papa.parse<string[]>(text.trim(), { skipEmptyLines: true });
    expect(parsed.errors).toEqual([]);
    const [header, ...rows] = parsed.data;
    expect(header).toEqual([...ANALYSIS_COLUMNS]);
    expect(README).toContain(ANALYSIS_COLUMNS.join(', '));
    const sim = simulateDemo(DEFAULT_DEMO_SEED);
    expect(rows).toHaveLength(new Set(sim.visits.map((v) => `${v.pond}|${v.season}`)).size * sim.truth.species.length);
    sim.truth.species.forEach((s, j) => {
      const csvTotal = rows.filter((r) => r[2] === s.key).reduce((a, r) => a + Number(r[3]), 0);
      expect(csvTotal).toBe(sim.visits.reduce((a, v) => a + v.counts[j], 0));
    });
    expect(rows.some((r) => r[0] === "Keeper's Pond")).toBe(true);
    expect(rows.every((r) => r.every((cell) => cell !== '' && cell !== 'NaN'))).toBe(true);
  });
});
