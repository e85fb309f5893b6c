/**
 * Simulation checks on seeded invented data: the fits recover known
 * parameters, and 95% Wald limits cover the true slope about 95% of the
 * time. With R replicates the Monte Carlo standard error of a coverage of
 * 0.95 is sqrt(0.95 * 0.05 / R) (0.0109 for R = 400); the checks accept
 * +/- 3 such errors.
 */
import { describe, expect, it } from 'vitest';
import { poissonFamily } from '@shared/engine/families/poisson';
import { irls } from '@shared/engine/irls';
import { fitNegbin } from '@shared/engine/negbin/fit';
import { negbin, poisson, rng } from './helpers/simulate';

function designWith(u: () => number, n: number): { x: Float64Array; x1: Float64Array; logEffort: Float64Array } {
  const x1 = Float64Array.from({ length: n }, () => u() * 2 - 1);
  const x = new Float64Array(2 * n);
  x.fill(1, 0, n);
  x.set(x1, n);
  const logEffort = Float64Array.from({ length: n }, () => Math.log(0.5 + u() * 2));
  return { x, x1, logEffort };
}

const B0 = 0.7;
const B1 = -0.4;

describe('Poisson simulation', () => {
  it('recovers known coefficients with an effort offset (n = 3000)', () => {
    const u = rng(20240601);
    const n = 3000;
    const { x, x1, logEffort } = designWith(u, n);
    const y = Float64Array.from(x1, (v, i) => poisson(u, Math.exp(B0 + B1 * v + logEffort[i])));
    const fit = irls({ x, n, p: 2, y, offset: logEffort, family: poissonFamily });
    const se = [Math.sqrt(fit.xtwxInverse[0]), Math.sqrt(fit.xtwxInverse[3])];
    expect(Math.abs(fit.beta[0] - B0)).toBeLessThan(4 * se[0]);
    expect(Math.abs(fit.beta[1] - B1)).toBeLessThan(4 * se[1]);
  });

  it('95% Wald limits cover the true slope in 400 replicates within the binomial margin', () => {
    const u = rng(7);
    const R = 400;
    const n = 120;
    let cover = 0;
    for (let r = 0; r < R; r++) {
      const { x, x1, logEffort } = designWith(u, n);
      const y = Float64Array.from(x1, (v, i) => poisson(u, Math.exp(B0 + B1 * v + logEffort[i])));
      const fit = irls({ x, n, p: 2, y, offset: logEffort, family: poissonFamily });
      const se = Math.sqrt(fit.xtwxInverse[3]);
      if (Math.abs(fit.beta[1] - B1) <= 1.959963984540054 * se) cover++;
    }
    const margin = 3 * Math.sqrt((0.95 * 0.05) / R);
    expect(Math.abs(cover / R - 0.95)).toBeLessThan(margin);
  });
});

describe('negative binomial simulation', () => {
  const THETA = 1.8;
  it('recovers coefficients and theta (n = 3000)', () => {
    const u = rng(99);
    const n = 3000;
    const { x, x1, logEffort } = designWith(u, n);
    const y = Float64Array.from(x1, (v, i) => negbin(u, Math.exp(B0 + B1 * v + logEffort[i]), THETA));
    const fit = fitNegbin({ x, n, p: 2, y, offset: logEffort });
    expect(fit.converged).toBe(true);
    expect(Math.abs(fit.theta! - THETA)).toBeLessThan(4 * fit.thetaSe!);
    expect(Math.abs(fit.irls.beta[1] - B1)).toBeLessThan(4 * Math.sqrt(fit.irls.xtwxInverse[3]));
  });

  it('95% Wald limits of the slope cover in 300 replicates within the binomial margin', () => {
    const u = rng(4242);
    const R = 300;
    const n = 150;
    let cover = 0;
    for (let r = 0; r < R; r++) {
      const { x, x1, logEffort } = designWith(u, n);
      const y = Float64Array.from(x1, (v, i) => negbin(u, Math.exp(B0 + B1 * v + logEffort[i]), THETA));
      const fit = fitNegbin({ x, n, p: 2, y, offset: logEffort });
      const se = Math.sqrt(fit.irls.xtwxInverse[3]);
      if (Math.abs(fit.irls.beta[1] - B1) <= 1.959963984540054 * se) cover++;
    }
    const margin = 3 * Math.sqrt((0.95 * 0.05) / R);
    expect(Math.abs(cover / R - 0.95)).toBeLessThan(margin);
  });

  it('Poisson data give the boundary (no overdispersion) or a large theta', () => {
    const u = rng(5);
    const n = 400;
    const { x, x1 } = designWith(u, n);
    const y = Float64Array.from(x1, (v) => poisson(u, Math.exp(B0 + B1 * v)));
    const fit = fitNegbin({ x, n, p: 2, y, offset: null });
    expect(fit.boundary || fit.theta! > 10).toBe(true);
    expect(Number.isFinite(fit.logLik)).toBe(true);
  });
});
