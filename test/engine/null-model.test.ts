/**
 * The intercept-only model's means (for the null deviance). Against R, the
 * null deviances of the glm.nb fixtures are checked in glm-reference.test.ts
 * (MASS glm.nb on quine and on epil with an offset); here: the score
 * equations the estimate must solve (common practice: the ML intercept sets
 * the score to zero), agreement with the general IRLS fit of the same
 * model, and offsets far from zero. Data: seeded simulation.
 */
import { describe, expect, it } from 'vitest';
import { negbinFamily } from '@shared/engine/families/negbin';
import { irls } from '@shared/engine/irls';
import { plainStructure } from '@shared/engine/linalg/dense';
import { nullModelMeans } from '@shared/engine/null-model';
import { negbin, rng } from './helpers/simulate';

function data(n: number, seed: number, offsetShift = 0): { y: Float64Array; offset: Float64Array } {
  const u = rng(seed);
  const offset = Float64Array.from({ length: n }, () => offsetShift + Math.log(0.5 + 3 * u()));
  const y = Float64Array.from(offset, (o) => negbin(u, 2 * Math.exp(o - offsetShift), 1.5));
  return { y, offset };
}

/** The NB score in the intercept, sum theta (y - mu) / (theta + mu), relative to sum y. */
function nbScore(y: Float64Array, mu: Float64Array, theta: number): number {
  let s = 0;
  let sy = 0;
  for (let i = 0; i < y.length; i++) {
    s += (theta * (y[i] - mu[i])) / (theta + mu[i]);
    sy += y[i];
  }
  return s / sy;
}

describe('null model means', () => {
  it('Poisson: the fitted total equals the observed total, in proportion to exp(offset)', () => {
    const { y, offset } = data(500, 11);
    const mu = nullModelMeans(y, offset, null);
    const sum = (a: Float64Array) => a.reduce((s, v) => s + v, 0);
    expect(Math.abs(sum(mu) - sum(y)) / sum(y)).toBeLessThan(1e-12);
    expect(mu[7] / mu[3]).toBeCloseTo(Math.exp(offset[7] - offset[3]), 12);
  });

  it('negative binomial: solves the score equation and agrees with IRLS on the intercept-only design', () => {
    for (const theta of [0.3, 1.5, 40]) {
      const { y, offset } = data(2000, 5 + theta, 0);
      const mu = nullModelMeans(y, offset, theta);
      expect(Math.abs(nbScore(y, mu, theta))).toBeLessThan(1e-12);
      const n = y.length;
      const fit = irls({ x: new Float64Array(n).fill(1), n, p: 1, y, offset, family: negbinFamily(theta), structure: plainStructure(1), covariance: false, control: { tolerance: 1e-14, maxIterations: 100 } });
      const b = Math.log(mu[0]) - offset[0];
      expect(Math.abs(b - fit.beta[0])).toBeLessThan(1e-8);
    }
  });

  it('negative binomial: offsets of several hundred on the log scale neither overflow nor lose the estimate', () => {
    const { y, offset } = data(300, 3, 600);
    const mu = nullModelMeans(y, offset, 2);
    expect(mu.every((m) => Number.isFinite(m) && m > 0)).toBe(true);
    expect(Math.abs(nbScore(y, mu, 2))).toBeLessThan(1e-10);
    // The same data with the offsets moved back by 600: the same means.
    const back = Float64Array.from(offset, (o) => o - 600);
    const mu0 = nullModelMeans(y, back, 2);
    for (let i = 0; i < y.length; i += 37) expect(mu[i] / mu0[i]).toBeCloseTo(1, 10);
  });

  it('an infinite theta is the Poisson null model', () => {
    const { y, offset } = data(200, 8);
    expect(Array.from(nullModelMeans(y, offset, Infinity))).toEqual(Array.from(nullModelMeans(y, offset, null)));
  });
});
