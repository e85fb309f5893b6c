/**
 * The Vuong (1989) test for two non-nested models fitted to the same counts,
 * from their per-observation log-likelihoods m_i = l1_i - l2_i:
 *   z = sum(m_i - c) / (sd(m) sqrt(n)),  sd with the n - 1 divisor,
 * with c = 0 (raw), c = (k1 - k2) / n (AIC-corrected) or
 * c = (k1 - k2) log(n) / (2 n) (BIC-corrected), k the parameter counts.
 * z > 0 favours model 1, z < 0 model 2; the p-value is the one-sided normal
 * tail in the direction of the sign. The caller chooses the parameter counts
 * (commonly only the regression coefficients are counted, not theta; AIC
 * counts theta too).
 */
import { twoSidedNormalP } from '../math/distributions';
import { usesCountDispersion } from '../../model/spec';
import type { FitOutcome } from '../types';
import { fitLogLikelihoods } from './pmf';

export type VuongFavours = 'first' | 'second';

export interface VuongStatistic {
  readonly statistic: number;
  /** One-sided p-value in the direction the statistic points. */
  readonly p: number;
  readonly favours: VuongFavours;
}

export interface VuongResult {
  readonly n: number;
  readonly raw: VuongStatistic;
  readonly aicCorrected: VuongStatistic;
  readonly bicCorrected: VuongStatistic;
  /** Sentence for the report: what the test can and cannot say. */
  readonly caution: string;
}

/**
 * Wilson (2015), "The misuse of the Vuong test for non-nested models to test
 * for zero-inflation", Economics Letters 127: 51-53.
 */
export const VUONG_ZERO_INFLATION_CAUTION =
  'A zero-inflated model contains its count model as a special case (an extra-zero probability of 0), so the two are not strictly non-nested and the Vuong test is not a valid test for zero-inflation (Wilson 2015); compare them by AIC or BIC and the fit to the observed zero counts instead.';

function oneSided(z: number): VuongStatistic {
  const favours: VuongFavours = z > 0 ? 'first' : 'second';
  return { statistic: z, p: twoSidedNormalP(z) / 2, favours };
}

export function vuongTest(logLik1: ArrayLike<number>, logLik2: ArrayLike<number>, k1: number, k2: number): VuongResult {
  const n = logLik1.length;
  if (n !== logLik2.length) throw new RangeError(`The two fits have different numbers of observations (${n} and ${logLik2.length}); the Vuong test needs the same rows.`);
  if (n < 3) throw new RangeError('The Vuong test needs at least 3 observations.');
  let sum = 0;
  for (let i = 0; i < n; i++) {
    const m = logLik1[i] - logLik2[i];
    if (!Number.isFinite(m)) throw new RangeError(`Observation ${i + 1} has a log-likelihood that is not finite in one of the fits; the Vuong test cannot use it.`);
    sum += m;
  }
  const mean = sum / n;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const d = logLik1[i] - logLik2[i] - mean;
    ss += d * d;
  }
  const sd = Math.sqrt(ss / (n - 1));
  if (!(sd > 0)) throw new RangeError('The two fits give identical per-observation log-likelihoods; the Vuong statistic is not defined.');
  const stat = (c: number) => oneSided((sum - n * c) / (sd * Math.sqrt(n)));
  return {
    n,
    raw: stat(0),
    aicCorrected: stat((k1 - k2) / n),
    bicCorrected: stat(((k1 - k2) * Math.log(n)) / (2 * n)),
    caution: VUONG_ZERO_INFLATION_CAUTION,
  };
}

/**
 * The Vuong test between two fits of the same rows. `count` chooses the
 * parameter counts for the corrections: 'coefficients' (every estimated
 * parameter but theta: the usual convention of this test's printouts) or
 * 'parameters' (theta too, as AIC counts: the summary's df).
 */
export function vuongForFits(first: FitOutcome, second: FitOutcome, count: 'coefficients' | 'parameters' = 'coefficients'): VuongResult {
  if (first.rows.length !== second.rows.length || first.rows.some((r, i) => r !== second.rows[i])) {
    throw new RangeError('The two fits use different rows (blank cells or filters differ); fit both to the same rows before comparing them.');
  }
  const k = (f: FitOutcome) => f.summary.df - (count === 'coefficients' && usesCountDispersion(f.distribution) ? 1 : 0);
  return vuongTest(fitLogLikelihoods(first), fitLogLikelihoods(second), k(first), k(second));
}
