/**
 * Mean and variance of one response under the whole model (count part and
 * zero part together), for fitted values and Pearson residuals.
 *
 * Zero-inflated (pi = probability of an extra zero):
 *   E = (1 - pi) mu,  Var = (1 - pi) mu (1 + pi mu + mu / theta)
 * Hurdle (p = probability of a non-zero count, f0 = count-part P(0)):
 *   E = p mu / (1 - f0),  E[y^2] = p (mu + mu^2 / theta + mu^2) / (1 - f0)
 * For Poisson counts mu / theta is 0.
 */
import type { CountKind } from './count-density';
import { countLogPmf } from './count-density';
import type { ZeroKind } from './observation-terms';

export interface Moments {
  mean: number;
  variance: number;
}

/** 1 - f(0) for the count part, without cancellation for small mu. */
export function countNonZeroProb(count: CountKind, mu: number, theta: number): number {
  return -Math.expm1(countLogPmf(count, 0, mu, theta));
}

export function responseMoments(zero: ZeroKind, count: CountKind, mu: number, zeroProb: number, theta: number): Moments {
  const extra = count === 'negbin' ? mu / theta : 0;
  if (zero === 'zero-inflated') {
    const pi = zeroProb;
    const mean = (1 - pi) * mu;
    return { mean, variance: mean * (1 + pi * mu + extra) };
  }
  const scale = zeroProb / countNonZeroProb(count, mu, theta);
  const mean = scale * mu;
  const second = scale * (mu + mu * extra + mu * mu);
  return { mean, variance: Math.max(second - mean * mean, 0) };
}
