import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import Papa from 'papaparse';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { exportSheet, sheetOf, type ExportSheet } from '@shared/export/export-model';
import type { Cell } from '@shared/report/model';
import { ExportWriteError, writeCleanedExport } from '../../src-main/export/write-export';
import { tempFolder } from '../project/temp-folder';
import { demoExport, type DemoExport } from './demo-export';

// The written files read back by outside readers: exceljs for the workbook,
// papaparse (an RFC 4180 parser) for the CSV, and LibreOffice headless to show
// the workbook opens without repair. Demo data: invented, simulated.

const folder = tempFolder('tw-export-write-');
afterAll(() => folder.remove());
let d: DemoExport;
beforeAll(async () => {
  d = await demoExport();
}, 120_000);

let hasSoffice = false;
try {
  execFileSync('soffice', ['--version'], { stdio: 'ignore', timeout: 60_000 });
  hasSoffice = true;
} catch {
  hasSoffice = false;
}

/** A workbook cell as the table holds it: exceljs gives null for an empty cell. */
function cellValue(v: ExcelJS.CellValue): Cell {
  if (v === null || v === undefined) return null;
  if (typeof v === 'number' || typeof v === 'string') return v;
  throw new Error(`unexpected cell ${JSON.stringify(v)}`);
}

describe('the workbook', () => {
  let wb: ExcelJS.Workbook;
  let path: string;
  beforeAll(async () => {
    path = join(folder.dir, 'cleaned.xlsx');
    const w = await writeCleanedExport(d.exported, path);
    expect(w).toMatchObject({ path, format: 'xlsx', sheets: ['Records', 'Analysis table', 'Changes', 'About'] });
    wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(path);
  }, 120_000);

  it('holds every table cell for cell: numbers as numbers, blanks empty, a frozen bold header', () => {
    for (const s of d.exported.sheets) {
      const ws = wb.getWorksheet(s.name)!;
      expect(ws, s.name).toBeDefined();
      expect(ws.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
      expect(ws.getRow(1).font?.bold).toBe(true);
      expect((ws.getRow(1).values as unknown[]).slice(1)).toEqual(s.table.columns.map((c) => c.header));
      expect(ws.rowCount).toBe(s.table.rows.length + 1);
      s.table.rows.forEach((r, i) => {
        const got = r.map((_, j) => cellValue(ws.getRow(i + 2).getCell(j + 1).value));
        expect(got).toEqual(r);
      });
    }
  });

  it('sets number formats and widths', () => {
    const ws = wb.getWorksheet('Records')!;
    // Row numbers as whole numbers; the file column wide enough for its names (at most 60).
    expect(ws.getRow(2).getCell(3).numFmt).toBe('0');
    const longest = Math.max(...d.sources.map((s) => s.summary.fileName.length));
    expect(ws.getColumn(1).width).toBe(Math.min(60, longest + 2));
  });

  it.skipIf(!hasSoffice)('opens in LibreOffice headless, the analysis sheet as the table', () => {
    const dir = join(folder.dir, 'soffice');
    mkdirSync(dir);
    const profile = `file://${join(dir, 'profile')}`;
    // One CSV per sheet (the csv filter's sheet option -1, LibreOffice 7.2+), as test/report/demo-documents.test.ts converts the report.
    execFileSync('soffice', [`-env:UserInstallation=${profile}`, '--headless', '--convert-to', 'csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1', '--outdir', dir, path], { stdio: 'pipe', timeout: 180_000 });
    const csvs = readdirSync(dir).filter((f) => f.endsWith('.csv'));
    expect(csvs).toHaveLength(4);
    const text = readFileSync(join(dir, csvs.find((f) => f.includes('Analysis'))!), 'utf8');
    const parsed = Papa.parse<string[]>(text.trim(), { skipEmptyLines: true }).data;
    const sheet = sheetOf(d.exported, 'analysis');
    expect(parsed[0]).toEqual(sheet.table.columns.map((c) => c.header));
    expect(parsed).toHaveLength(sheet.table.rows.length + 1);
    // The site and species of every row, as written.
    expect(parsed.slice(1).map((r) => r[0])).toEqual(sheet.table.rows.map((r) => r[0]));
  }, 200_000);
});

describe('CSV of one table', () => {
  it('is the analysis table by default: UTF-8 with a BOM, and parses back to the same cells', async () => {
    const path = join(folder.dir, 'analysis.csv');
    const w = await writeCleanedExport(d.exported, path);
    expect(w.sheets).toEqual(['Analysis table']);
    const bytes = readFileSync(path);
    expect([...bytes.subarray(0, 3)]).toEqual([0xef, 0xbb, 0xbf]);
    const parsed = Papa.parse<string[]>(bytes.toString('utf8').slice(1), { skipEmptyLines: true }).data;
    const sheet = sheetOf(d.exported, 'analysis');
    expect(parsed[0]).toEqual(sheet.table.columns.map((c) => c.header));
    expect(parsed.slice(1)).toEqual(sheet.table.rows.map((r) => r.map((c) => (c === null ? '' : String(c)))));
    // Numbers read back as the same numbers (JavaScript's shortest round-trip form).
    const j = sheet.table.columns.findIndex((c) => c.header.startsWith('log_effort'));
    expect(parsed.slice(1).map((r) => (r[j] === '' ? null : Number(r[j])))).toEqual(sheet.table.rows.map((r) => r[j]));
  });

  it('the records table on request, with the visit covariate heading in UTF-8', async () => {
    const path = join(folder.dir, 'records.csv');
    await writeCleanedExport(d.exported, path, 'records');
    const parsed = Papa.parse<string[]>(readFileSync(path, 'utf8').slice(1), { skipEmptyLines: true }).data;
    expect(parsed).toHaveLength(d.analysis.cleaned.length + 1);
    expect(parsed[0]).toContain('Water temp (°C) (visit covariate)');
  });

  it('quotes as RFC 4180 asks: commas, quotes, line breaks and edge spaces', async () => {
    const tricky: ExportSheet = exportSheet('records', 'Records', 'test', [{ header: 'a, b' }, { header: 'n' }], [
      ['say "hi"', 1.5],
      ['two\nlines', null],
      [' padded ', -0.25],
    ]);
    const path = join(folder.dir, 'tricky.csv');
    await writeCleanedExport({ createdAt: '2026-12-01T10:00:00.000Z', title: 't', counts: { records: 3, kept: 3, leftOut: 0, analysisRows: 0 }, sheets: [tricky] }, path, 'records');
    const text = readFileSync(path, 'utf8').slice(1);
    // RFC 4180 section 2: fields with commas, quotes or line breaks are quoted, quotes doubled; CRLF line ends.
    expect(text).toBe('"a, b",n\r\n"say ""hi""",1.5\r\n"two\nlines",\r\n" padded ",-0.25\r\n');
    expect(Papa.parse<string[]>(text, { skipEmptyLines: true }).data).toEqual([['a, b', 'n'], ['say "hi"', '1.5'], ['two\nlines', ''], [' padded ', '-0.25']]);
  });
});

describe('write failures', () => {
  it('name the file and the fix', async () => {
    const path = join(folder.dir, 'no-such-folder', 'out.xlsx');
    const err = await writeCleanedExport(d.exported, path).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(ExportWriteError);
    expect((err as Error).name).toBe('ExportWriteError');
    expect((err as Error).message).toContain(path);
    expect((err as Error).message).toMatch(/ENOENT.*Choose a folder you can write to/);
    expect(existsSync(path)).toBe(false);
  });

  it('refuse a file that is neither .xlsx nor .csv', async () => {
    await expect(writeCleanedExport(d.exported, join(folder.dir, 'out.ods'))).rejects.toThrow(/does not end in \.xlsx or \.csv/);
  });
});
