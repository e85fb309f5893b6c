import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { reportWorkbook, sheetName } from '../../src-main/report/xlsx';
import { MARKUP, reference, shipsReport, tolerance } from './ships-report';

async function readBack(): Promise<ExcelJS.Workbook> {
  const { doc } = await shipsReport();
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load((await reportWorkbook(doc)) as unknown as ArrayBuffer);
  return wb;
}

describe('XLSX report', () => {
  it('has one sheet per table, each with a frozen header row', async () => {
    const wb = await readBack();
    expect(wb.worksheets.map((w) => w.name)).toEqual(['Trend summary', 'Indices', 'Coefficients']);
    for (const ws of wb.worksheets) {
      expect(ws.views[0]).toMatchObject({ state: 'frozen', ySplit: 1 });
      expect(ws.getRow(1).font?.bold).toBe(true);
    }
  });

  it('the indices sheet holds the indices and limits of stats::glm on MASS::ships as numbers, with number formats', async () => {
    const ws = (await readBack()).getWorksheet('Indices')!;
    expect((ws.getRow(1).values as unknown[]).slice(1)).toEqual(['species', 'year', 'Index', 'Lower 95%', 'Upper 95%']);
    reference.indices.forEach((r, i) => {
      const row = ws.getRow(i + 2);
      expect(row.getCell(1).value).toBe(MARKUP); // plain text in a cell, not a formula or markup
      expect(row.getCell(2).value).toBe(r.time);
      for (const [col, want, tol] of [[3, r.index, tolerance.index], [4, r.lower, tolerance.limit], [5, r.upper, tolerance.limit]] as const) {
        const got = row.getCell(col).value as number;
        expect(Math.abs(got - want) / Math.max(1, Math.abs(want))).toBeLessThan(tol);
        expect(row.getCell(col).numFmt).toBe('0.0');
      }
    });
  });

  it('the trend summary holds the slope of stats::glm (linear year) with its limits, formatted as percentages', async () => {
    const ws = (await readBack()).getWorksheet('Trend summary')!;
    const row = ws.getRow(2);
    for (const [col, want] of [[2, reference.slope.perYear], [3, reference.slope.lower], [4, reference.slope.upper]] as const) {
      expect(Math.abs((row.getCell(col).value as number) - want)).toBeLessThan(tolerance.slope);
      expect(row.getCell(col).numFmt).toBe('0.0%');
    }
  });

  it('the coefficients sheet lists the factor level named as markup as a plain text term, with p-values formatted', async () => {
    const ws = (await readBack()).getWorksheet('Coefficients')!;
    const terms = ws.getColumn(2).values.slice(2);
    expect(terms).toContain(`type=${MARKUP}`);
    expect(ws.getColumn(6).numFmt).toBe('0.0000');
  });

  it('sheet names are made acceptable to Excel and unique', () => {
    const taken = new Set<string>();
    expect(sheetName('a/b:c', taken)).toBe('a b c');
    expect(sheetName('A/B:C', taken)).toBe('A B C 2');
    expect(sheetName('x'.repeat(40), taken)).toHaveLength(31);
  });
});
