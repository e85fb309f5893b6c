/** The report's tables as a workbook: one sheet per table, frozen header row, number formats. */
import ExcelJS from 'exceljs';
import type { ReportDocument, SheetTable } from '@shared/report/model';
import { spreadsheetFormat } from '@shared/report/number-format';

/** A sheet name Excel accepts: no : \ / ? * [ ], at most 31 characters, unique in the workbook. */
export function sheetName(name: string, taken: Set<string>): string {
  const clean = name.replace(/[:\\/?*[\]]/g, ' ').trim().slice(0, 31) || 'Sheet';
  let out = clean;
  for (let n = 2; taken.has(out.toLowerCase()); n++) out = `${clean.slice(0, 31 - String(n).length - 1)} ${n}`;
  taken.add(out.toLowerCase());
  return out;
}

function addTable(wb: ExcelJS.Workbook, sheet: SheetTable, taken: Set<string>): void {
  const t = sheet.table;
  const ws = wb.addWorksheet(sheetName(sheet.name, taken), { views: [{ state: 'frozen', ySplit: 1 }] });
  const header = ws.addRow(t.columns.map((c) => c.header));
  header.font = { bold: true };
  for (const r of t.rows) {
    // Non-finite numbers become empty cells: a spreadsheet never shows NaN.
    ws.addRow(r.map((cell) => (typeof cell === 'number' && !Number.isFinite(cell) ? null : cell)));
  }
  t.columns.forEach((c, j) => {
    const col = ws.getColumn(j + 1);
    const fmt = spreadsheetFormat(c.format);
    if (fmt) col.numFmt = fmt;
    // A loop, not Math.max(...rows): a long table would overflow the argument list.
    let longest = c.header.length;
    for (const r of t.rows) longest = Math.max(longest, typeof r[j] === 'string' ? (r[j] as string).length : 10);
    col.width = Math.min(60, Math.max(8, longest + 2));
  });
  header.numFmt = '@';
  if (t.notes?.length) {
    ws.addRow([]);
    for (const n of t.notes) ws.addRow([n]).font = { italic: true };
  }
}

export async function reportWorkbook(doc: ReportDocument): Promise<Buffer> {
  return tablesWorkbook(doc.title, doc.createdAt, doc.sheets);
}

/** Tables as a workbook, one sheet each (the report's sheets, the cleaned-data export). */
export async function tablesWorkbook(title: string, createdAt: string, sheets: readonly SheetTable[]): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  wb.creator = 'Tallywise';
  wb.created = new Date(createdAt);
  wb.modified = wb.created;
  wb.title = title;
  const taken = new Set<string>();
  for (const s of sheets) addTable(wb, s, taken);
  return Buffer.from(await wb.xlsx.writeBuffer());
}
