/**
 * van den Broek (1995) score test for zero inflation against a hand
 * computation in R (make-zero.R, fixture `scoreTests`): Poisson GLMs on
 * pscl's bioChemists, with and without covariates. The R side uses the
 * general formula with mu' X (X'WX)^-1 X' mu; ours the equivalent sum(y).
 */
import { describe, expect, it } from 'vitest';
import { zeroInflationScoreTest } from '@shared/engine/zero/score-test';
import { reference } from './reference-data';

describe.each(reference.scoreTests.map((s) => [s.id, s] as const))('%s', (_id, ref) => {
  const r = zeroInflationScoreTest(ref.y, ref.mu);
  it('statistic matches the general formula and the intercept formula (1e-8 relative)', () => {
    expect(Math.abs(r.statistic - ref.withCovariates.statistic) / ref.withCovariates.statistic).toBeLessThan(1e-8);
    expect(Math.abs(r.statistic - ref.interceptFormula.statistic) / ref.interceptFormula.statistic).toBeLessThan(1e-8);
  });
  it('df is 1 and p matches pchisq(S, 1, lower.tail = FALSE): 1e-6 relative above 1e-10, 1e-15 absolute below', () => {
    // The shared normal tail (jstat erfc) is accurate in absolute, not relative, terms far in the tail.
    expect(r.df).toBe(1);
    const want = ref.withCovariates.p;
    if (want > 1e-10) expect(Math.abs(r.p - want) / want).toBeLessThan(1e-6);
    else expect(Math.abs(r.p - want)).toBeLessThan(1e-15);
  });
});

describe('score test input', () => {
  it('refuses mismatched lengths and non-positive means with a plain message', () => {
    expect(() => zeroInflationScoreTest([0, 1], [1])).toThrow(/differ in length/);
    expect(() => zeroInflationScoreTest([0, 1], [1, 0])).toThrow(/Fitted mean 2/);
  });
  it('a Poisson sample with as many zeros as expected gives a small statistic (common practice)', () => {
    // y = 0, 1, 2 with frequencies close to Poisson(1) proportions 0.37, 0.37, 0.18 ...
    const y = [0, 0, 0, 0, 0, 0, 0, 1, 1, 1, 1, 1, 1, 1, 2, 2, 2, 3, 4];
    const mean = y.reduce((a, b) => a + b, 0) / y.length;
    const r = zeroInflationScoreTest(y, y.map(() => mean));
    expect(r.p).toBeGreaterThan(0.2);
  });
});
