/**
 * The demo programme's composite index (its 4 species, each with the model
 * the demo project chose; site-block bootstrap, 199 replicates unless given)
 * on worker threads, run two ways in the same process:
 *   - reference: each species refit of each replicate sent to the workers as a
 *     fit of its own (the resampled tables made in this thread, whole fits sent back);
 *   - replicates: each replicate sent whole (the workers resample, fit every
 *     species and send back the composite's log indices).
 * Prints wall and CPU seconds (CPU of every thread of the process) of each,
 * their ratios, and the largest relative difference between the two results
 * (the same seed must give the same limits). Needs the built worker
 * (out/cli/fit-worker.mjs); asserts nothing.
 *   node composite.mjs [replicates]
 */
import { existsSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { resolve } from 'node:path';
import type { ReportFitMethods } from '../../src-shared/report/fit-worker-methods';
import { nodeWorker } from '../../bin/cli/worker/node-worker';
import { demoProject } from '../../src-main/demo/demo-project';
import { projectPlan } from '../../src-main/report/project-report';
import { compositeTrend, type CompositeResult } from '../../src-shared/trend/composite';
import { poolRunner, servesReplicates } from '../../src-shared/trend/pool-runner';
import { WorkerPool } from '../../src-shared/worker/pool';

const replicates = Number(process.argv[2] ?? 199);
const workerFile = resolve('out/cli/fit-worker.mjs');
if (!existsSync(workerFile)) {
  console.log(`No built worker at ${workerFile}: run \`npx vite build --config vite.cli.config.ts\` first.`);
  process.exit(0);
}
const { plan } = await projectPlan(await demoProject(), { species: [], projectFile: null, software: { name: 'Tallywise', version: 'bench' }, createdAt: new Date().toISOString(), command: 'bench', replicates });
const threads = Math.max(1, availableParallelism());
const run = async (pool: WorkerPool<ReportFitMethods>) => {
  const c0 = { wall: performance.now(), cpu: process.cpuUsage() };
  const r = await compositeTrend(plan.compositeTable!, plan.groups[0].spec, plan.groupColumn!, { replicates, seed: plan.seed ?? 1, specs: Object.fromEntries(plan.groups.map((g) => [g.group, g.spec])), runner: poolRunner(pool) });
  const cpu = process.cpuUsage(c0.cpu);
  pool.dispose();
  return { r, wall: (performance.now() - c0.wall) / 1000, cpu: (cpu.user + cpu.system) / 1e6 };
};
const fits = await run(new WorkerPool<ReportFitMethods>(() => nodeWorker(workerFile), { size: threads }));
const whole = await run(servesReplicates(new WorkerPool<ReportFitMethods>(() => nodeWorker(workerFile), { size: threads })));
const numbers = (c: CompositeResult) => c.composite.indices.flatMap((row) => [row.index, row.lower, row.upper]);
const [a, b] = [numbers(fits.r), numbers(whole.r)];
const diff = Math.max(...a.map((x, i) => Math.abs(x - b[i]) / Math.max(Math.abs(x), 1e-300)));
const s = (x: number) => x.toFixed(2);
console.log(`composite of ${plan.groups.length} species, ${replicates} replicates, ${threads} worker threads`);
console.log(`  reference (separate fits): ${s(fits.wall)} s wall, ${s(fits.cpu)} s CPU`);
console.log(`  whole replicates:          ${s(whole.wall)} s wall, ${s(whole.cpu)} s CPU`);
console.log(`  whole over reference: ${s(whole.wall / fits.wall)} x the wall time, ${s(whole.cpu / fits.cpu)} x the CPU time; failed replicates ${fits.r.composite.failedReplicates} and ${whole.r.composite.failedReplicates}; largest relative difference of index and limits ${diff.toExponential(1)}`);
