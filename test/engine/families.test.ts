import { describe, expect, it } from 'vitest';
import { negbinFamily } from '@shared/engine/families/negbin';
import { poissonFamily, quasiPoissonFamily } from '@shared/engine/families/poisson';
import type { Family } from '@shared/engine/families/types';
import { lgamma } from '@shared/engine/math/lgamma';

function pmfSum(f: Family, mu: number, upTo: number): number {
  let s = 0;
  for (let y = 0; y <= upTo; y++) s += Math.exp(f.logLik!(y, mu));
  return s;
}

describe('families', () => {
  it('log-likelihoods are full log-pmfs: they sum to 1 over y (common practice)', () => {
    expect(pmfSum(poissonFamily, 3.7, 200)).toBeCloseTo(1, 12);
    expect(pmfSum(negbinFamily(0.8), 3.7, 2000)).toBeCloseTo(1, 9);
    expect(pmfSum(negbinFamily(50), 12, 400)).toBeCloseTo(1, 12);
  });

  it('NB mean and variance are mu and mu + mu^2/theta', () => {
    const theta = 1.5;
    const mu = 4;
    const f = negbinFamily(theta);
    let m = 0;
    let m2 = 0;
    for (let y = 0; y < 3000; y++) {
      const p = Math.exp(f.logLik!(y, mu));
      m += y * p;
      m2 += y * y * p;
    }
    expect(m).toBeCloseTo(mu, 8);
    expect(m2 - m * m).toBeCloseTo(f.variance(mu), 6);
    expect(f.variance(mu)).toBeCloseTo(mu + (mu * mu) / theta, 14);
  });

  it('the negative binomial tends to the Poisson as theta grows', () => {
    const nb = negbinFamily(1e9);
    for (const [y, mu] of [
      [0, 2],
      [5, 2.5],
      [30, 21],
    ]) {
      expect(nb.logLik!(y, mu)).toBeCloseTo(poissonFamily.logLik!(y, mu), 6);
      expect(nb.unitDeviance(y, mu)).toBeCloseTo(poissonFamily.unitDeviance(y, mu), 6);
    }
  });

  it('the Poisson log-likelihood includes the log(y!) constant', () => {
    // log P(Y = 4 | mu = 2.5) = 4 log 2.5 - 2.5 - log 24 (common practice)
    expect(poissonFamily.logLik!(4, 2.5)).toBeCloseTo(4 * Math.log(2.5) - 2.5 - Math.log(24), 13);
  });

  it('deviance residuals square to the unit deviance and carry the sign of y - mu', () => {
    for (const f of [poissonFamily, negbinFamily(2)]) {
      for (const [y, mu] of [
        [0, 1.5],
        [3, 1.5],
        [1, 4],
      ]) {
        const r = f.devianceResidual(y, mu);
        expect(r * r).toBeCloseTo(f.unitDeviance(y, mu), 12);
        expect(Math.sign(r)).toBe(Math.sign(y - mu));
      }
    }
  });

  it('unit deviance is 2 (l(y; y) - l(mu; y)): zero at mu = y', () => {
    for (const f of [poissonFamily, negbinFamily(3)]) {
      for (const [y, mu] of [
        [2, 3.1],
        [7, 4],
      ]) {
        expect(f.unitDeviance(y, y)).toBeCloseTo(0, 12);
        expect(f.unitDeviance(y, mu)).toBeCloseTo(2 * (f.logLik!(y, y) - f.logLik!(y, mu)), 10);
      }
    }
  });

  it('quasi-Poisson has Poisson moments, a dispersion and no likelihood', () => {
    expect(quasiPoissonFamily.logLik).toBeNull();
    expect(quasiPoissonFamily.hasDispersion).toBe(true);
    expect(quasiPoissonFamily.variance(3)).toBe(3);
  });

  it('lgamma matches known values', () => {
    // Gamma(0.5) = sqrt(pi), Gamma(10) = 9! (common practice)
    expect(lgamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 13);
    expect(lgamma(10)).toBeCloseTo(Math.log(362880), 12);
    expect(lgamma(1)).toBeCloseTo(0, 14);
    expect(lgamma(1e6)).toBeCloseTo(1e6 * Math.log(1e6) - 1e6 - 0.5 * Math.log(1e6) + 0.5 * Math.log(2 * Math.PI) + 1 / 12e6, 6);
  });
});
