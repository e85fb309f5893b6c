// Import benchmark: our reader (with field-code classification) against
// exceljs's streaming reader on the same 200k-row x 8-column workbook, each in
// its own child process, in the same run. Prints times, peak RSS and ratios.
//
//   node bench/import/run.mjs [rows] [--repeat=3] [--keep]
//
// The TypeScript children are bundled with esbuild into bench/output/import/
// (ignored by git); the workbook is written there too, once per row count.
import { build } from 'esbuild';
import { execFileSync } from 'node:child_process';
import { existsSync, mkdirSync, rmSync } from 'node:fs';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';

const here = dirname(fileURLToPath(import.meta.url));
const root = resolve(here, '../..');
const out = join(root, 'bench/output/import');
const rows = Number(process.argv.find((a) => /^\d+$/.test(a)) ?? 200_000);
mkdirSync(out, { recursive: true });

await build({
  entryPoints: ['gen-cli.ts', 'run-ours.ts', 'run-exceljs.ts'].map((f) => join(here, f)),
  outdir: out,
  bundle: true,
  platform: 'node',
  format: 'esm',
  target: 'node20',
  packages: 'external',
  outExtension: { '.js': '.mjs' },
  alias: { '@shared': join(root, 'src-shared') },
  logLevel: 'warning',
});

const book = join(out, `bench-${rows}.xlsx`);
if (!existsSync(book)) {
  console.error(`writing ${book} (${rows} rows) with exceljs's streaming writer ...`);
  execFileSync(process.execPath, [join(out, 'gen-cli.mjs'), book, String(rows)], { stdio: 'inherit' });
}

const repeat = Number(process.argv.find((a) => a.startsWith('--repeat='))?.slice(9) ?? 3);
const child = (script) => JSON.parse(execFileSync(process.execPath, [join(out, script), book], { encoding: 'utf8' }).trim().split('\n').pop());
const median = (runs, key) => [...runs].sort((a, b) => a[key] - b[key])[Math.floor(runs.length / 2)][key];
// Alternate the two readers so that a change in machine load hits both alike; report medians.
const oursRuns = [];
const theirRuns = [];
for (let i = 0; i < repeat; i++) {
  oursRuns.push(child('run-ours.mjs'));
  theirRuns.push(child('run-exceljs.mjs'));
}
const summary = (runs) => ({ ...runs[0], ms: median(runs, 'ms'), cpuMs: median(runs, 'cpuMs'), maxRssMB: median(runs, 'maxRssMB') });
const ours = summary(oursRuns);
const theirs = summary(theirRuns);
const fmt = (r) => `${r.reader.padEnd(16)} ${(r.ms / 1000).toFixed(2).padStart(6)} s wall ${(r.cpuMs / 1000).toFixed(2).padStart(6)} s cpu ${r.maxRssMB.toFixed(0).padStart(5)} MB peak RSS  ${r.rows} rows, ${r.cells} cells (median of ${repeat})`;
console.log(fmt(ours));
console.log(fmt(theirs));
console.log(`ratios (exceljs / ours): wall ${(theirs.ms / ours.ms).toFixed(2)}x, cpu ${(theirs.cpuMs / ours.cpuMs).toFixed(2)}x, memory ${(theirs.maxRssMB / ours.maxRssMB).toFixed(2)}x`);
console.log(`targets: <= 3 s and <= 300 MB -> ${ours.ms <= 3000 ? 'time ok' : 'time OVER'}, ${ours.maxRssMB <= 300 ? 'memory ok' : 'memory OVER'}`);
if (!process.argv.includes('--keep')) rmSync(join(out, 'run-ours.mjs'), { force: true });
