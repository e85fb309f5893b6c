/**
 * Seeded simulations of invented zero-inflated counts (./simulate.ts):
 * the known parameters are recovered within a few standard errors, and a
 * negative-binomial fit to Poisson-type counts ends at the theta boundary
 * with a warning.
 */
import { describe, expect, it } from 'vitest';
import { fitZeroModel } from '@shared/engine/zero/fit-zero';
import type { Distribution } from '@shared/model/spec';
import { parseModelSpec } from '@shared/model/spec';
import { simulateZeroInflated } from './simulate';

function spec(distribution: Distribution) {
  const terms = [
    { column: 'x1', type: 'numeric' as const },
    { column: 'x2', type: 'numeric' as const },
  ];
  return parseModelSpec({ response: 'count', distribution, predictors: terms, zeroPredictors: terms });
}

function expectRecovered(est: { estimate: number; se: number }[], truth: number[]): void {
  est.forEach((c, j) => {
    expect(Math.abs(c.estimate - truth[j]), `coefficient ${j}`).toBeLessThan(4 * c.se);
    expect(c.se).toBeLessThan(0.35);
  });
}

describe('simulated zero-inflated counts (seeded, invented)', () => {
  const beta = [0.6, 0.8, -0.5];
  const gamma = [-0.8, 1.2, 0.4];

  it('ZIP: 3000 rows recover the count and zero-part coefficients within 4 SE', () => {
    const sim = simulateZeroInflated(20261201, 3000, beta, gamma);
    const out = fitZeroModel(sim.table, spec('zip'));
    expect(out.summary.converged).toBe(true);
    expectRecovered(out.summary.coefficients, beta);
    expectRecovered(out.summary.zeroCoefficients, gamma);
    expect(out.summary.warnings).toEqual([]);
  });

  it('ZINB: theta = 2 recovered within 4 SE on the log scale, coefficients within 4 SE', () => {
    const sim = simulateZeroInflated(99, 3000, beta, gamma, 2);
    const out = fitZeroModel(sim.table, spec('zinb'));
    expect(out.summary.converged).toBe(true);
    expectRecovered(out.summary.coefficients, beta);
    expectRecovered(out.summary.zeroCoefficients, gamma);
    expect(Math.abs(Math.log(out.summary.theta!) - Math.log(2))).toBeLessThan(0.4);
    expect(out.summary.alpha).toBeCloseTo(1 / out.summary.theta!, 12);
  });

  it('ZINB on Poisson-type counts: theta runs to its limit, converged, with a boundary-theta warning and finite SEs', () => {
    const sim = simulateZeroInflated(7, 2000, beta, gamma);
    const zinb = fitZeroModel(sim.table, spec('zinb'));
    const zip = fitZeroModel(sim.table, spec('zip'));
    expect(zinb.summary.converged).toBe(true);
    expect(zinb.warnings.map((w) => w.code)).toContain('boundary-theta');
    expect(zinb.summary.coefficients.every((c) => Number.isFinite(c.se) && c.se > 0)).toBe(true);
    // At theta -> infinity ZINB is ZIP (common practice): same coefficients and log-likelihood.
    expect(Math.abs(zinb.summary.logLikelihood! - zip.summary.logLikelihood!)).toBeLessThan(1e-3);
    zinb.summary.coefficients.forEach((c, j) => expect(c.estimate).toBeCloseTo(zip.summary.coefficients[j].estimate, 3));
  });

  it('hurdle Poisson on the same kind of data gives a zero part for P(non-zero) (signs flip against ZI)', () => {
    const sim = simulateZeroInflated(5, 3000, beta, gamma);
    const out = fitZeroModel(sim.table, spec('hurdle-poisson'));
    expect(out.summary.converged).toBe(true);
    // More extra zeros with larger x1 (gamma[1] > 0) means P(non-zero) falls with x1.
    expect(out.summary.zeroCoefficients[1].estimate).toBeLessThan(0);
    // Every per-row zeroProb is P(y > 0); the fitted zero share matches the observed share (common practice for a logit with intercept).
    const observed = out.y.filter((v) => v === 0).length;
    const expected = out.zeroProb!.reduce((a, p) => a + (1 - p), 0);
    expect(Math.abs(observed - expected)).toBeLessThan(1e-6);
  });
});
