/**
 * Seeded simulation of invented zero-inflated count data for tests and the
 * benchmark, drawn with the shared seeded generator and samplers
 * (src-shared/demo/prng.ts, samplers.ts).
 */
import type { DataTable } from '../../../src-shared/data/table';
import { columnFromNumbers } from '../../../src-shared/data/table';
import { createRng } from '../../../src-shared/demo/prng';
import { sampleNegBinomial, samplePoisson } from '../../../src-shared/demo/samplers';

export interface ZeroSimulation {
  table: DataTable;
  beta: number[];
  gamma: number[];
}

/**
 * n rows with predictors x1..xp (uniform on -1..1) in both parts; count
 * part log-linear with coefficients beta, extra zeros with logit gamma;
 * theta (optional) makes the counts negative binomial.
 */
export function simulateZeroInflated(seed: number, n: number, beta: number[], gamma: number[], theta?: number): ZeroSimulation {
  const rng = createRng(seed);
  const p = Math.max(beta.length, gamma.length) - 1;
  const xs = Array.from({ length: p }, () => new Float64Array(n));
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let eta = beta[0];
    let zeta = gamma[0];
    for (let j = 0; j < p; j++) {
      const x = 2 * rng.uniform() - 1;
      xs[j][i] = x;
      eta += (beta[j + 1] ?? 0) * x;
      zeta += (gamma[j + 1] ?? 0) * x;
    }
    const pi = 1 / (1 + Math.exp(-zeta));
    const mu = Math.exp(eta);
    const extraZero = rng.uniform() < pi;
    const count = theta === undefined ? samplePoisson(rng, mu) : sampleNegBinomial(rng, mu, theta);
    y[i] = extraZero ? 0 : count;
  }
  const columns = [columnFromNumbers('count', y), ...xs.map((x, j) => columnFromNumbers(`x${j + 1}`, x))];
  return { table: { nrows: n, columns }, beta, gamma };
}
