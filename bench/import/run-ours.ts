import { compileFieldCodes, classifyColumn } from '../../src-shared/import/field-codes';
import { importFile } from '../../src-main/import/import-file';

/** Child process: our import plus field-code classification of the count columns; prints one JSON line. */
const path = process.argv[2];
const t0 = performance.now();
const cpu0 = process.cpuUsage();
const table = await importFile(path);
const classify = compileFieldCodes();
let counted = 0;
for (const col of table.columns.slice(5)) {
  const c = classifyColumn(col, classify);
  for (let i = 0; i < c.status.length; i++) if (c.status[i] === 0) counted++;
}
const ms = performance.now() - t0;
const cpu = process.cpuUsage(cpu0);
const cpuMs = (cpu.user + cpu.system) / 1000;
console.log(JSON.stringify({ reader: 'tallywise', ms, cpuMs, rows: table.nrows, cells: table.nrows * table.columns.length, counted, maxRssMB: process.resourceUsage().maxRSS / 1024 }));
