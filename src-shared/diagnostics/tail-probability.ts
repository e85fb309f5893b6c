/**
 * The upper tail P(Y_i >= y) of a fitted count distribution, accurate far
 * out: 1 - F(y - 1) loses every digit once F is within 1e-16 of 1 (a count
 * of 241 where 114 is expected has P about 3e-25 under the Poisson), so
 * beyond F(y - 1) = 0.999 the tail is summed from its masses instead.
 */
import type { FittedDistribution } from './fitted-distribution';

/** Beyond this F(y - 1) the tail is summed from the masses, where 1 - F keeps its digits. */
export const FAR_UPPER = 0.999;

/** P(Y >= from), summed upward from `from` until the terms no longer count. */
export function upperTailSum(dist: FittedDistribution, i: number, from: number): number {
  const mu = dist.parameters(i).mu;
  let acc = 0;
  for (let k = from; k < from + 1e6; k++) {
    const p = dist.mass(i, k);
    acc += p;
    if (k > mu && p <= acc * 1e-17) break;
  }
  return acc;
}

/** P(Y_i >= y). */
export function upperTail(dist: FittedDistribution, i: number, y: number): number {
  if (y <= 0) return 1;
  const below = dist.cdf(i, y - 1);
  return below > FAR_UPPER ? upperTailSum(dist, i, y) : Math.max(0, 1 - below);
}
