import { mkdir, writeFile } from 'node:fs/promises';
import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { buildDemo } from '@shared/demo/build';
import { analysisCsvText, analysisRows } from '@shared/demo/analysis-table';
import type { PlantedProblem } from '@shared/demo/mess';
import { PROGRAMME_NAME } from '@shared/demo/programme';
import { utcDate } from '@shared/demo/dates';
import { isDateCell, type SheetGrid, type WorkbookGrid } from '@shared/demo/sheet-grid';
import { simulateDemo } from '@shared/demo/simulate';
import { DEFAULT_DEMO_SEED } from '@shared/demo/truth';

/** How dates are shown on the demo sheets (day first, as the fictional programme's volunteers write them). */
export const DEMO_DATE_FORMAT = 'dd/mm/yyyy';

export interface DemoWorkbooksResult {
  /** Paths of the season workbooks written, first season first. */
  files: string[];
  planted: PlantedProblem[];
}

/**
 * Writes the demo programme as one messy tally workbook per season
 * (`<programme-slug>-<season>.xlsx`) into outDir, creating it if needed.
 */
export async function writeDemoWorkbooks(outDir: string, opts: { seed?: number } = {}): Promise<DemoWorkbooksResult> {
  const demo = buildDemo(checkedSeed(opts.seed));
  const files: string[] = [];
  let path = outDir;
  try {
    await mkdir(outDir, { recursive: true });
    for (const book of demo.workbooks) {
      path = join(outDir, book.fileName);
      await writeFile(path, await workbookBytes(book));
      files.push(path);
    }
  } catch (err) {
    throw new DemoWriteError(`Could not write "${path}" (${reason(err)}). Choose a folder you can write to, with free space.`);
  }
  return { files, planted: demo.planted };
}

/** A demo file could not be written; the message names the file and the fix. */
export class DemoWriteError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'DemoWriteError';
  }
}

function reason(err: unknown): string {
  const code = (err as { code?: unknown })?.code;
  return typeof code === 'string' ? code : err instanceof Error ? err.message : String(err);
}

function checkedSeed(seed: number | undefined): number {
  if (seed === undefined) return DEFAULT_DEMO_SEED;
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new RangeError(`The demo seed must be a whole number from 0 to 4294967295, not ${seed}.`);
  return seed;
}

/**
 * The clean long analysis table of the demo (one row per pond x season x
 * species, before any mess) as CSV text; also written to outFile when given.
 */
export function writeDemoCsv(opts: { seed?: number; outFile?: string } = {}): string {
  const text = analysisCsvText(analysisRows(simulateDemo(checkedSeed(opts.seed))));
  if (opts.outFile) {
    try {
      writeFileSync(opts.outFile, text, 'utf8');
    } catch (err) {
      throw new DemoWriteError(`Could not write "${opts.outFile}" (${reason(err)}). Choose a folder you can write to, with free space.`);
    }
  }
  return text;
}

/** One workbook grid as .xlsx bytes. */
export async function workbookBytes(book: WorkbookGrid): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = PROGRAMME_NAME;
  // A fixed time stamp, so the same seed gives the same file contents.
  wb.created = new Date(Date.UTC(book.season, 5, 30));
  wb.modified = wb.created;
  for (const grid of book.sheets) addSheet(wb, grid);
  return Buffer.from(await wb.xlsx.writeBuffer());
}

function addSheet(wb: ExcelJS.Workbook, grid: SheetGrid): void {
  const ws = wb.addWorksheet(grid.name, { views: [{ state: 'frozen', ySplit: grid.headerRow }] });
  grid.widths.forEach((w, c) => {
    ws.getColumn(c + 1).width = w;
  });
  grid.rows.forEach((cells, r) => {
    cells.forEach((cell, c) => {
      if (cell === null) return;
      const target = ws.getCell(r + 1, c + 1);
      if (isDateCell(cell)) {
        target.value = utcDate(cell.date);
        target.numFmt = DEMO_DATE_FORMAT;
      } else {
        target.value = cell;
      }
    });
  });
  ws.getRow(grid.headerRow).font = { bold: true };
  if (grid.headerRow > 1) ws.getCell(1, 1).font = { bold: true, size: 13 };
}
