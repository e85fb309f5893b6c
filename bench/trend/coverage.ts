/**
 * Coverage of the 95% slope limits, full version (the CI test in
 * test/trend/coverage.test.ts runs 200 replicates of the same design).
 * Negative-binomial counts (theta 2), normal site effects (SD 0.5), 25 sites
 * x 8 seasons x 2 visits, 4% a year decline; refitted with a negative
 * binomial log-linear trend and fixed (absorbed) site effects, in this
 * thread (`random` as the second argument: a random site intercept).
 * Prints the coverage with its Monte-Carlo 95% interval and the
 * runtime; asserts nothing. Run: bash bench/trend/run.sh [replicates] [fixed|random]
 */
import { slopeCoverage } from '../../src-shared/trend/coverage-study';

const replicates = Number(process.argv[2] ?? 2000);
const siteEffect = process.argv[3] === 'random' ? 'random' : 'fixed';
const design = { sites: 25, seasons: 8, visits: 2, meanCount: 4, theta: 2, siteSd: 0.5, annualChange: -0.04, alpha: 0.05 };
const start = process.hrtime.bigint();
const cpu0 = process.cpuUsage();
const r = await slopeCoverage(design, replicates, 2026, { siteEffect });
const seconds = Number(process.hrtime.bigint() - start) / 1e9;
const cpu = process.cpuUsage(cpu0);
const lo = r.coverage - 1.96 * r.mcse;
const hi = r.coverage + 1.96 * r.mcse;
console.log(`design: ${JSON.stringify(design)}; refits with ${siteEffect} site effects`);
console.log(`replicates fitted: ${r.replicates} (failed ${r.failed})`);
console.log(`coverage of the 95% slope limits: ${r.coverage.toFixed(4)} (Monte-Carlo 95% interval ${lo.toFixed(4)} to ${hi.toFixed(4)}); target 0.94-0.96`);
console.log(`runtime: ${seconds.toFixed(1)} s elapsed, ${((cpu.user + cpu.system) / 1e6).toFixed(1)} s CPU, ${((1000 * seconds) / replicates).toFixed(2)} ms per simulated programme`);
