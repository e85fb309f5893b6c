/**
 * Derivatives of the per-observation count log-likelihood match finite
 * differences (common practice), and the log-likelihood matches the
 * engine's Poisson and negative-binomial families.
 */
import { describe, expect, it } from 'vitest';
import { countConstant, countD1, countD1Theta, countD2, countD2Theta, countD3, countDTheta, countKernel, countWeight } from '@shared/engine/sites/count-derivatives';
import { negbinFamily } from '@shared/engine/families/negbin';
import { poissonFamily } from '@shared/engine/families/poisson';
import digamma from '@stdlib/math-base-special-digamma';

const ll = (y: number, eta: number, theta: number) => countConstant(y, theta) + countKernel(y, eta, theta);
const cases: [number, number, number][] = [
  [0, -1.2, 0.7],
  [3, 0.4, 2.5],
  [17, 2.1, 12],
  [2, 1.5, Infinity],
  [40, 3.3, 0.3],
];

describe('count log-likelihood derivatives', () => {
  it('equal the families\' log-likelihoods', () => {
    for (const [y, eta, th] of cases) {
      const ref = th === Infinity ? poissonFamily.logLik!(y, Math.exp(eta)) : negbinFamily(th).logLik!(y, Math.exp(eta));
      expect(ll(y, eta, th)).toBeCloseTo(ref, 10);
    }
  });

  it('in eta match central differences up to order 3', () => {
    const h = 1e-5;
    for (const [y, eta, th] of cases) {
      const mu = Math.exp(eta);
      const fd1 = (ll(y, eta + h, th) - ll(y, eta - h, th)) / (2 * h);
      expect(countD1(y, mu, th)).toBeCloseTo(fd1, 5);
      const fd2 = (countD1(y, Math.exp(eta + h), th) - countD1(y, Math.exp(eta - h), th)) / (2 * h);
      expect(countD2(y, mu, th)).toBeCloseTo(fd2, 5);
      const fd3 = (countD2(y, Math.exp(eta + h), th) - countD2(y, Math.exp(eta - h), th)) / (2 * h);
      expect(countD3(y, mu, th)).toBeCloseTo(fd3, 5);
      expect(countWeight(mu, th)).toBeGreaterThan(0);
    }
  });

  it('in theta match central differences', () => {
    for (const [y, eta, th] of cases) {
      if (th === Infinity) continue;
      const mu = Math.exp(eta);
      const h = 1e-6 * th;
      const fdL = (ll(y, eta, th + h) - ll(y, eta, th - h)) / (2 * h);
      const d = y === 0 ? 0 : digamma(y + th) - digamma(th);
      const dTh = countDTheta(y, mu, th, d);
      expect(dTh).toBeCloseTo(fdL, 5);
      const fd1 = (countD1(y, mu, th + h) - countD1(y, mu, th - h)) / (2 * h);
      expect(countD1Theta(y, mu, th)).toBeCloseTo(fd1, 6);
      const fd2 = (countD2(y, mu, th + h) - countD2(y, mu, th - h)) / (2 * h);
      expect(countD2Theta(y, mu, th)).toBeCloseTo(fd2, 6);
    }
  });
});
