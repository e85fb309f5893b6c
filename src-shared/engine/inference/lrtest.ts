/** Likelihood-ratio tests between fits of the same rows. */
import type { FitSummary } from '../../model/fit-result';
import { chiSquareUpper } from '../math/distributions';

export interface LrTest {
  readonly statistic: number;
  readonly df: number;
  readonly p: number;
  readonly message: string;
}

function check(reduced: FitSummary, full: FitSummary): { llR: number; llF: number } {
  if (reduced.logLikelihood === null || full.logLikelihood === null) {
    throw new Error('A likelihood-ratio test needs two fits with a likelihood; quasi-Poisson has none (compare the deviances scaled by the dispersion instead).');
  }
  if (reduced.nobs !== full.nobs) {
    throw new Error(`The two fits use different rows (${reduced.nobs} and ${full.nobs}), so their likelihoods cannot be compared. Fit both to the same rows.`);
  }
  return { llR: reduced.logLikelihood, llF: full.logLikelihood };
}

/**
 * The LR test of a reduced model nested in a full one: 2 (l_full - l_reduced)
 * against chi-square with the difference in parameters as df. Nesting is the
 * caller's claim; it is not checked beyond the counts.
 */
export function lrTest(reduced: FitSummary, full: FitSummary): LrTest {
  const { llR, llF } = check(reduced, full);
  const df = full.df - reduced.df;
  if (df <= 0) throw new Error(`The full model must have more parameters than the reduced one (they have ${full.df} and ${reduced.df}).`);
  const statistic = Math.max(0, 2 * (llF - llR));
  const p = chiSquareUpper(statistic, df);
  return { statistic, df, p, message: `Likelihood-ratio test: statistic ${statistic.toPrecision(4)} on ${df} df, p = ${p.toPrecision(3)}.` };
}

/**
 * Negative binomial against Poisson with the same mean model: theta = infinity
 * (alpha = 0) is on the boundary of the parameter space, so the statistic is
 * a 50:50 mixture of 0 and chi-square(1) under the null and p is half the
 * chi-square(1) tail (Self & Liang 1987, JASA 82, 605-610).
 */
export function negbinVsPoissonTest(poisson: FitSummary, negbin: FitSummary): LrTest {
  const { llR, llF } = check(poisson, negbin);
  const statistic = Math.max(0, 2 * (llF - llR));
  const p = statistic > 0 ? chiSquareUpper(statistic, 1) / 2 : 1;
  return {
    statistic,
    df: 1,
    p,
    message: `Overdispersion test (negative binomial against Poisson, boundary-corrected): statistic ${statistic.toPrecision(4)}, p = ${p.toPrecision(3)}.`,
  };
}
