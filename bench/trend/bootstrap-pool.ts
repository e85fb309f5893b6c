/**
 * Site-block bootstrap of the demo's common toad trend (negative binomial,
 * fixed pond effects, annual seasons; 2 refits per replicate) in this thread
 * and across worker threads; prints both times and their ratio. Needs the
 * built worker (`npm run build:cli` writes out/cli/fit-worker.mjs); asserts
 * nothing. Run: bash bench/trend/run.sh --pool [replicates]
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { resolve } from 'node:path';
import { nodeWorker } from '../../bin/cli/worker/node-worker';
import { tableFromTexts, splitBy } from '../../src-shared/data/table';
import { parseModelSpec } from '../../src-shared/model/spec';
import { inThreadRunner } from '../../src-shared/trend/fit-runner';
import { poolRunner } from '../../src-shared/trend/pool-runner';
import { analyseTrend } from '../../src-shared/trend/trend-analysis';
import type { FitMethods } from '../../src-shared/worker/fit-methods';
import { WorkerPool } from '../../src-shared/worker/pool';
import { writeDemoCsv } from '../../src-main/demo/write-workbooks';

const replicates = Number(process.argv[2] ?? 100);
const workerFile = resolve('out/cli/fit-worker.mjs');
if (!existsSync(workerFile)) {
  console.log(`No built worker at ${workerFile}: run \`npm run build:cli\` first.`);
  process.exit(0);
}
const lines = writeDemoCsv({}).trim().split(/\r?\n/);
const all = tableFromTexts(lines[0].split(','), lines.slice(1).map((l) => l.split(',')));
const table = splitBy(all, 'species').find((g) => g.key === 'common_toad')!.table;
const spec = parseModelSpec({
  response: 'count',
  distribution: 'negbin',
  offsets: [{ column: 'minutes' }, { column: 'area_m2' }],
  site: { column: 'pond', effect: 'fixed' },
  time: { column: 'season', trend: 'annual' },
});

async function timed(label: string, run: () => Promise<unknown>): Promise<number> {
  const t0 = process.hrtime.bigint();
  await run();
  const s = Number(process.hrtime.bigint() - t0) / 1e9;
  console.log(`${label}: ${s.toFixed(2)} s`);
  return s;
}
const threads = Math.max(1, availableParallelism());
const pool = new WorkerPool<FitMethods>(() => nodeWorker(workerFile), { size: threads });
const one = await timed(`in this thread, ${replicates} replicates`, () => analyseTrend(table, spec, { limits: 'bootstrap', replicates, seed: 1, runner: inThreadRunner }));
const many = await timed(`on ${threads} worker threads`, () => analyseTrend(table, spec, { limits: 'bootstrap', replicates, seed: 1, runner: poolRunner(pool) }));
pool.dispose();
console.log(`ratio in-thread / pool: ${(one / many).toFixed(2)} (ideal about ${threads})`);
