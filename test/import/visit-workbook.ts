import ExcelJS from 'exceljs';

/**
 * Writes an invented workbook with exceljs for the import tests: a sheet of
 * `rows` visits (site, date, visit, observer, minutes, two species' counts)
 * and a sheet listing the `sites` with their areas.
 */
export async function writeVisitWorkbook(path: string, rows: number, sites: number): Promise<void> {
  const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ filename: path, useSharedStrings: true, useStyles: true });
  const visits = wb.addWorksheet('Visits');
  visits.addRow(['Site', 'Date', 'Visit', 'Observer', 'Minutes', 'Newt', 'Toad']).commit();
  const start = Date.UTC(2021, 2, 1);
  for (let i = 0; i < rows; i++) {
    const row = visits.addRow([`Pond ${1 + (i % sites)}`, new Date(start + (i % 120) * 86_400_000), 1 + (i % 4), `Obs ${1 + (i % 9)}`, 20 + (i % 40), i % 13, (i * 7) % 11]);
    row.getCell(2).numFmt = 'yyyy-mm-dd';
    row.commit();
  }
  visits.commit();
  const list = wb.addWorksheet('Sites');
  list.addRow(['Site', 'Area (m2)']).commit();
  for (let s = 1; s <= sites; s++) list.addRow([`Pond ${s}`, 100 + s]).commit();
  list.commit();
  await wb.commit();
}
