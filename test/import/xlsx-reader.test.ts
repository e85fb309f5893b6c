import { mkdtemp, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeDemoWorkbooks } from '../../src-main/demo/write-workbooks';
import { importFile, listSheets, readBytes, readWorkbookGrids } from '../../src-main/import/import-file';
import { cellAt, cellKindNames } from '../../src-shared/import/cells';
import { ImportError } from '../../src-shared/import/import-error';

/**
 * The lean workbook reader against exceljs (an outside reader) on the demo
 * workbooks: the same cells, kinds and values in every sheet.
 */
let dir: string;
let files: string[];
beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'tw-xlsx-'));
  files = (await writeDemoWorkbooks(dir, { seed: 11 })).files;
});
afterAll(async () => {
  await rm(dir, { recursive: true, force: true });
});

describe('xlsx reader', () => {
  it('reads the same cells as exceljs in every demo sheet (three seasons)', async () => {
    for (const file of [files[0], files[5], files[files.length - 1]]) {
      const wb = new ExcelJS.Workbook();
      await wb.xlsx.readFile(file);
      const names = wb.worksheets.map((w) => w.name);
      const { grids } = await readWorkbookGrids(await readBytes(file), file, { sheets: names });
      let compared = 0;
      wb.worksheets.forEach((ws, s) => {
        const grid = grids[s];
        expect(grid.sheet).toBe(ws.name);
        expect(grid.nrows).toBe(ws.rowCount);
        for (let r = 1; r <= ws.rowCount; r++) {
          for (let c = 1; c <= Math.max(ws.columnCount, grid.ncols); c++) {
            const v = ws.getCell(r, c).value;
            const ours = cellAt(grid, r, c);
            if (v === null || v === undefined) expect(ours.kind, `${ws.name}!${r},${c}`).toBe('blank');
            else if (typeof v === 'number') {
              expect(ours.kind).toBe('number');
              expect(ours.number).toBe(v);
            } else if (typeof v === 'string') {
              expect(ours.kind).toBe('text');
              expect(ours.text).toBe(v);
            } else if (v instanceof Date) {
              expect(ours.kind).toBe('date');
              expect(ours.text).toBe(v.toISOString().slice(0, 10));
            } else throw new Error(`unexpected exceljs value at ${ws.name}!${r},${c}: ${JSON.stringify(v)}`);
            compared++;
          }
        }
      });
      expect(compared).toBeGreaterThan(500);
    }
  });

  it('lists the sheets of a demo workbook with their hidden state', async () => {
    expect(await listSheets(files[0])).toEqual([{ name: 'Counts', hidden: false }, { name: 'Ponds', hidden: false }]);
  });

  it('finds the header below the title rows and leaves the closing note out', async () => {
    const t = await importFile(files[0]);
    expect(t.headerRows).toEqual([5]);
    expect(t.columns[0].name).toBe('Pond');
    expect(t.rowNumbers[0]).toBe(6);
    expect(t.notes.filter((n) => n.where === 'above').map((n) => n.row)).toEqual([1, 2, 3]);
    expect(t.notes.filter((n) => n.where === 'below')).toHaveLength(1);
    expect(cellKindNames[t.columns[1].kinds[0]]).toBe('date');
  });

  it('stacks two sheets by header name, keeping each row its sheet and row number', async () => {
    const t = await importFile(files[0], { sheets: ['Ponds', 'Counts'] });
    expect(t.sheets).toEqual(['Ponds', 'Counts']);
    const pond = t.columns.find((c) => c.name === 'Pond')!;
    expect(pond.letters).toEqual(['A', 'A']);
    expect(t.sheetIndex[0]).toBe(0);
    expect(t.sheetIndex[t.nrows - 1]).toBe(1);
    expect(t.findings.some((f) => f.code === 'stack-column-missing' && f.columnName === 'Habitat')).toBe(true);
  });

  it('reports progress up to 1 and can be cancelled', async () => {
    const seen: number[] = [];
    await importFile(files[0], { onProgress: (f) => seen.push(f) });
    expect(seen.length).toBeGreaterThan(0);
    expect(seen[seen.length - 1]).toBe(1);
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
    const controller = new AbortController();
    controller.abort();
    const err = await importFile(files[0], { signal: controller.signal }).catch((e) => e);
    expect(err).toBeInstanceOf(ImportError);
    expect(err.code).toBe('cancelled');
  });

  it('says so when the file does not exist', async () => {
    const err = await importFile(join(dir, 'nope.xlsx')).catch((e) => e);
    expect(err).toMatchObject({ name: 'ImportError', code: 'unreadable-file' });
    expect(err.message).toMatch(/does not exist\. Check the path/);
  });
});
