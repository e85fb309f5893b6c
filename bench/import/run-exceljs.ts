import ExcelJS from 'exceljs';

/** Child process: exceljs's streaming reader walking every cell of the same file; prints one JSON line. */
const path = process.argv[2];
const t0 = performance.now();
const cpu0 = process.cpuUsage();
let rows = 0;
let cells = 0;
const reader = new ExcelJS.stream.xlsx.WorkbookReader(path, { sharedStrings: 'cache', styles: 'cache', worksheets: 'emit', hyperlinks: 'ignore' });
for await (const ws of reader) {
  for await (const row of ws) {
    rows++;
    row.eachCell(() => {
      cells++;
    });
  }
}
const ms = performance.now() - t0;
const cpu = process.cpuUsage(cpu0);
const cpuMs = (cpu.user + cpu.system) / 1000;
console.log(JSON.stringify({ reader: 'exceljs-stream', ms, cpuMs, rows, cells, maxRssMB: process.resourceUsage().maxRSS / 1024 }));
