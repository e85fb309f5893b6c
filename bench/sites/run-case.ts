/**
 * One benchmark case in its own process (so that its peak memory is its
 * own): node run-case.js fixed|random|random9 SITES SEASONS MISSING
 * (random: Laplace, random9: 9-node adaptive quadrature)
 * Prints one JSON line: fit time (wall ms and CPU ms, data generation
 * excluded), peak RSS (MB),
 * log-likelihood, theta, iterations.
 */
import { fitAbsorbedSites } from '../../src-shared/engine/sites/absorbed';
import { fitRandomSite } from '../../src-shared/engine/sites/random';
import { parseModelSpec } from '../../src-shared/model/spec';
import { makeGrid } from './grid';

const [kind, sitesArg, seasonsArg, missingArg] = process.argv.slice(2);
const grid = makeGrid(Number(sitesArg), Number(seasonsArg), Number(missingArg));
const spec = parseModelSpec({
  response: 'count',
  distribution: 'negbin',
  predictors: [
    { column: 'season', type: 'factor' },
    { column: 'cover', type: 'numeric' },
  ],
  offsets: [{ column: 'effort', log: true }],
  site: { column: 'site', effect: kind === 'fixed' ? 'fixed' : 'random', quadraturePoints: kind === 'random9' ? 9 : 1 },
});
const c0 = process.cpuUsage();
const t0 = performance.now();
const fit = kind === 'fixed' ? fitAbsorbedSites(grid.table, spec) : fitRandomSite(grid.table, spec);
const ms = performance.now() - t0;
const cpu = process.cpuUsage(c0);
const cpuMs = (cpu.user + cpu.system) / 1000;
const rssMb = process.resourceUsage().maxRSS / 1024;
console.log(
  JSON.stringify({ kind, rows: grid.table.nrows, ms, cpuMs, rssMb, logLik: fit.summary.logLikelihood, theta: fit.theta, sd: fit.summary.random?.sd ?? null, iterations: fit.summary.iterations, converged: fit.summary.converged }),
);
