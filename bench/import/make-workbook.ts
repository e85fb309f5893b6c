import ExcelJS from 'exceljs';

/**
 * Writes the benchmark workbook: a title row, a note, a header and `rows`
 * visit rows of 8 columns (site, date, visit, observer, minutes and three
 * species counts with a few field codes), with exceljs's streaming writer.
 * Invented data from a seeded generator.
 */
export async function makeBenchWorkbook(path: string, rows = 200_000, seed = 7): Promise<void> {
  let s = seed >>> 0;
  const rand = () => {
    s = (s * 1664525 + 1013904223) >>> 0;
    return s / 2 ** 32;
  };
  const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ filename: path, useSharedStrings: true, useStyles: true });
  const ws = wb.addWorksheet('Visits');
  ws.addRow(['Pond visits, benchmark programme']).commit();
  ws.addRow(['Counts per visit; NS = not surveyed']).commit();
  ws.addRow(['Site', 'Date', 'Visit', 'Observer', 'Minutes', 'Newt', 'Toad', 'Frog']).commit();
  const codes = ['NS', 'x', '>50', '~20'];
  const start = Date.UTC(2019, 2, 1);
  for (let i = 0; i < rows; i++) {
    const count = () => (rand() < 0.02 ? codes[Math.floor(rand() * codes.length)] : Math.floor(rand() * 40));
    const row = ws.addRow([
      `Pond ${1 + Math.floor(rand() * 2000)}`,
      new Date(start + Math.floor(rand() * 150) * 86_400_000),
      1 + (i % 4),
      `Obs ${1 + Math.floor(rand() * 30)}`,
      15 + Math.floor(rand() * 60),
      count(),
      count(),
      count(),
    ]);
    row.getCell(2).numFmt = 'yyyy-mm-dd';
    row.commit();
  }
  ws.commit();
  await wb.commit();
}
