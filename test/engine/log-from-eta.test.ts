import { describe, expect, it } from 'vitest';
import { negbinFamily } from '@shared/engine/families/negbin';
import { poissonFamily } from '@shared/engine/families/poisson';
import { irls, irlsWork } from '@shared/engine/irls';
import { logLink, MU_MIN } from '@shared/engine/links/log';
import { logCount } from '@shared/engine/math/log-count';
import { negbinLogLik } from '@shared/engine/negbin/fit';
import { negbin, rng } from './helpers/simulate';

// The sums that read log(mu) from the linear predictor (log link) and log(y)
// from the table of counts must equal the sums written with Math.log of mu and y.

function directDeviance(family: { unitDeviance(y: number, mu: number): number }, y: Float64Array, mu: Float64Array, w: Float64Array | null): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) s += (w ? w[i] : 1) * family.unitDeviance(y[i], mu[i]);
  return s;
}

function directNegbinLogLik(y: Float64Array, mu: Float64Array, theta: number, w: Float64Array | null): number {
  const f = negbinFamily(theta);
  let s = 0;
  for (let i = 0; i < y.length; i++) s += (w ? w[i] : 1) * f.logLik!(y[i], mu[i]);
  return s;
}

describe('log(mu) from eta, log(y) from the table of counts', () => {
  const u = rng(31);
  const n = 4000;
  // Linear predictors from -45 (mean on the floor of the log link) to 8; counts from an NB2 with those means,
  // a few past the table of logs (4096).
  const eta = Float64Array.from({ length: n }, (_, i) => (i % 97 === 0 ? -45 : -3 + 11 * u() * u()));
  const mu = new Float64Array(n);
  logLink.linkinvAll(eta, mu);
  const y = Float64Array.from(mu, (m, i) => (i % 501 === 0 ? 5000 + i : negbin(u, m, 1.5)));
  const w = Float64Array.from({ length: n }, () => 0.5 + u());

  it('logCount is Math.log for counts in and past the table, and for non-integers', () => {
    for (const v of [1, 2, 3, 17, 4095, 4096, 10_000, 2.5, 0.25]) expect(logCount(v)).toBe(Math.log(v));
    expect(logCount(0)).toBe(-Infinity);
  });

  it('some means are on the floor, so both branches of log(mu) are taken', () => {
    expect(mu.some((m) => m === MU_MIN)).toBe(true);
    expect(mu.some((m) => m > 100)).toBe(true);
  });

  for (const [label, family] of [
    ['Poisson', poissonFamily],
    ['NB theta 1.5', negbinFamily(1.5)],
    ['NB theta 1e7', negbinFamily(1e7)],
  ] as const) {
    it(`${label} deviance agrees with the unit deviances summed (with and without weights)`, () => {
      for (const wt of [null, w]) {
        const direct = directDeviance(family, y, mu, wt);
        expect(Math.abs(family.deviance(y, mu, wt, eta) - direct)).toBeLessThan(1e-12 * direct);
        expect(family.deviance(y, mu, wt)).toBeCloseTo(direct, 6);
      }
    });
  }

  for (const theta of [0.3, 1.5, 50, 1e7]) {
    it(`NB log-likelihood at theta ${theta} agrees with the per-observation log-likelihood summed`, () => {
      for (const wt of [null, w]) {
        const direct = directNegbinLogLik(y, mu, theta, wt);
        expect(Math.abs(negbinLogLik(y, mu, theta, wt, undefined, eta) - direct)).toBeLessThan(1e-11 * Math.abs(direct));
      }
    });
  }
});

describe('IRLS started where an earlier fit ended', () => {
  it('gives the same fit as the start recomputed from the coefficients, with shared scratch space', () => {
    const u = rng(32);
    const n = 3000;
    const p = 3;
    const x = new Float64Array(n * p);
    const offset = new Float64Array(n);
    const y = new Float64Array(n);
    for (let i = 0; i < n; i++) {
      x[i] = 1;
      x[n + i] = u() * 2 - 1;
      x[2 * n + i] = u() < 0.4 ? 1 : 0;
      offset[i] = Math.log(0.5 + u());
      y[i] = negbin(u, Math.exp(0.5 + 0.3 * x[n + i] - 0.4 * x[2 * n + i] + offset[i]), 2);
    }
    const work = irlsWork(n);
    const start = irls({ x, n, p, y, offset, family: poissonFamily, covariance: false, work, control: { tolerance: 1e-2 } });
    const family = negbinFamily(2);
    const recomputed = irls({ x, n, p, y, offset, family, startBeta: start.beta });
    const carried = irls({ x, n, p, y, offset, family, startBeta: start.beta, startAt: start, work });
    expect(carried.converged).toBe(true);
    expect(Array.from(carried.beta)).toEqual(Array.from(recomputed.beta));
    expect(carried.deviance).toBe(recomputed.deviance);
    expect(carried.iterations).toBe(recomputed.iterations);
    expect(Array.from(carried.xtwxInverse)).toEqual(Array.from(recomputed.xtwxInverse));
  });
});
