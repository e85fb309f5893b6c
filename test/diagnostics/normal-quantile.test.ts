/** The tail-accurate normal quantile against R's qnorm (fixture made by make-diagnostics.R, R 4.2.2). */
import { describe, expect, it } from 'vitest';
import { normalQuantileAccurate } from '@shared/diagnostics/normal-quantile';
import { normalCdf } from './normal-cdf';
import { quineRef } from './quine-reference';

describe('normalQuantileAccurate (R: qnorm)', () => {
  it('matches qnorm to 1e-12 relative from p = 1e-300 to 1 - 1e-9', () => {
    const { p, q } = quineRef.normalQuantile;
    p.forEach((pk, k) => expect(Math.abs(normalQuantileAccurate(pk) - q[k])).toBeLessThanOrEqual(1e-12 * Math.abs(q[k]) + 1e-15));
  });
  it('the tests\' normal CDF (A&S 7.1.26) inverts qnorm to 2e-7', () => {
    const { p, q } = quineRef.normalQuantile;
    p.forEach((pk, k) => expect(Math.abs(normalCdf(q[k]) - pk)).toBeLessThan(2e-7));
  });
  it('is infinite at 0 and 1 and antisymmetric', () => {
    expect(normalQuantileAccurate(0)).toBe(Number.NEGATIVE_INFINITY);
    expect(normalQuantileAccurate(1)).toBe(Number.POSITIVE_INFINITY);
    expect(normalQuantileAccurate(0.2) + normalQuantileAccurate(0.8)).toBeCloseTo(0, 12);
  });
});
