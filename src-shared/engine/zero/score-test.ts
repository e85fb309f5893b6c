/**
 * Score test for zero inflation in Poisson counts (van den Broek 1995,
 * "A score test for zero inflation in a Poisson distribution", Biometrics
 * 51: 738-743). With p0_i = exp(-mu_i) from the fitted Poisson model,
 *   S = [sum (1{y_i = 0} - p0_i) / p0_i]^2 / [sum (1 - p0_i) / p0_i - sum y_i],
 * chi-square with 1 df under "no zero inflation". The subtracted sum is
 * mu' X (X' W X)^-1 X' mu of the general formula, which equals sum mu_i =
 * sum y_i for a Poisson log-linear fit with an intercept at its maximum
 * likelihood (mu = fitted means); so only y and mu are needed.
 */
import { twoSidedNormalP } from '../math/distributions';

export interface ScoreTestResult {
  readonly statistic: number;
  readonly df: 1;
  readonly p: number;
}

export function zeroInflationScoreTest(y: ArrayLike<number>, mu: ArrayLike<number>): ScoreTestResult {
  const n = y.length;
  if (n !== mu.length) throw new RangeError(`The counts (${n}) and fitted means (${mu.length}) differ in length.`);
  let num = 0;
  let den = 0;
  for (let i = 0; i < n; i++) {
    if (!(mu[i] > 0)) throw new RangeError(`Fitted mean ${i + 1} is not positive; the score test needs the means of a Poisson fit.`);
    // (1{y=0} - p0) / p0 = 1{y=0} e^mu - 1;  (1 - p0) / p0 = expm1(mu)
    num += (y[i] === 0 ? Math.exp(mu[i]) : 0) - 1;
    den += Math.expm1(mu[i]) - y[i];
  }
  if (!(den > 0) || !Number.isFinite(den)) {
    throw new RangeError('The score test for zero inflation is not defined here (its variance term is not positive or overflows: some fitted means are too large).');
  }
  const statistic = (num * num) / den;
  // P(chi2_1 > S) = P(|N(0,1)| > sqrt(S)), accurate far into the tail.
  return { statistic, df: 1, p: twoSidedNormalP(Math.sqrt(statistic)) };
}
