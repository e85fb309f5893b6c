/**
 * Probability mass and CDF of every count distribution: Poisson and NB2
 * against R's dpois/ppois/dnbinom/pnbinom (fixture `pmf` in zero-fits.json,
 * made by make-zero.R), and each distribution summing to 1 (common practice).
 */
import { describe, expect, it } from 'vitest';
import type { CountDistribution } from '@shared/engine/zero/pmf';
import { cumulativeProbability, logProbabilityMass, probabilityMass } from '@shared/engine/zero/pmf';
import { reference } from './reference-data';

const all: CountDistribution[] = ['poisson', 'negbin', 'zip', 'zinb', 'hurdle-poisson', 'hurdle-negbin'];

function close(ours: number, ref: number, tol: number): boolean {
  return Math.abs(ours - ref) <= tol || Math.abs(ours - ref) <= 1e-9 * Math.abs(ref);
}

describe('Poisson and negative binomial against R (stats::dpois, ppois, dnbinom, pnbinom)', () => {
  const tol = reference.pmf.tolerance;
  it.each(reference.pmf.cases.map((c) => [c.mu, c.theta, c] as const))('mu %s, theta %s', (mu, theta, c) => {
    c.y.forEach((y, i) => {
      expect(close(probabilityMass('poisson', y, { mu }), c.dpois[i], tol), `dpois(${y})`).toBe(true);
      expect(close(cumulativeProbability('poisson', y, { mu }), c.ppois[i], tol), `ppois(${y})`).toBe(true);
      expect(close(probabilityMass('negbin', y, { mu, theta }), c.dnbinom[i], tol), `dnbinom(${y})`).toBe(true);
      expect(close(cumulativeProbability('negbin', y, { mu, theta }), c.pnbinom[i], tol), `pnbinom(${y})`).toBe(true);
    });
  });
});

describe('every distribution is a distribution (common practice)', () => {
  const params = [
    { mu: 0.02, theta: 0.5, zeroProb: 0.3 },
    { mu: 1.7, theta: 3, zeroProb: 0.8 },
    { mu: 25, theta: 40, zeroProb: 0.05 },
  ];
  it.each(all)('%s sums to 1 and its CDF is the running sum', (d) => {
    for (const p of params) {
      let sum = 0;
      for (let y = 0; y <= 400; y++) {
        sum += probabilityMass(d, y, p);
        if (y % 25 === 0) expect(Math.abs(cumulativeProbability(d, y, p) - sum)).toBeLessThan(1e-12);
      }
      expect(Math.abs(sum - 1)).toBeLessThan(1e-10);
    }
  });

  it('zero part: zip/zinb add zeros with probability pi; hurdle P(0) = 1 - p', () => {
    const p = { mu: 2.2, theta: 1.5, zeroProb: 0.35 };
    expect(probabilityMass('zip', 0, p)).toBeCloseTo(0.35 + 0.65 * Math.exp(-2.2), 14);
    expect(probabilityMass('zinb', 3, p)).toBeCloseTo(0.65 * probabilityMass('negbin', 3, p), 14);
    expect(probabilityMass('hurdle-poisson', 0, p)).toBeCloseTo(0.65, 14);
    expect(probabilityMass('hurdle-negbin', 2, p)).toBeCloseTo((0.35 * probabilityMass('negbin', 2, p)) / (1 - probabilityMass('negbin', 0, p)), 14);
    expect(probabilityMass('zip', 4, { mu: 2.2, zeroProb: 0 })).toBeCloseTo(probabilityMass('poisson', 4, p), 14);
  });

  it('stays finite at extreme means; a non-count has mass 0; bad parameters are refused', () => {
    expect(Number.isFinite(logProbabilityMass('poisson', 1000, { mu: 1000 }))).toBe(true);
    expect(cumulativeProbability('negbin', 0, { mu: 5000, theta: 2 })).toBeGreaterThan(0);
    expect(cumulativeProbability('poisson', 10, { mu: 2000 })).toBe(0);
    // Truncated count part at a tiny mean: almost all positive mass sits at 1.
    expect(probabilityMass('hurdle-poisson', 1, { mu: 1e-10, zeroProb: 0.4 })).toBeCloseTo(0.4, 9);
    expect(probabilityMass('poisson', 2.5, { mu: 1 })).toBe(0);
    expect(cumulativeProbability('zip', -1, { mu: 1, zeroProb: 0.2 })).toBe(0);
    expect(() => probabilityMass('negbin', 1, { mu: 1, theta: -1 })).toThrow(/theta/);
    expect(() => probabilityMass('zip', 1, { mu: 1 })).toThrow(/zero-part probability/);
  });
});
