/**
 * Probability mass and cumulative probability of one count under every
 * count distribution of the spec, given the per-observation parameters a fit
 * hands on (FitOutcome.mu, .theta, .zeroProb). Rootograms, randomized
 * quantile residuals and expected zero counts are built from these.
 *
 *   poisson, negbin      f(y; mu, theta)            (NB2: variance mu + mu^2 / theta)
 *   zip, zinb            pi 1{y = 0} + (1 - pi) f(y)  zeroProb = pi, the probability of an extra zero
 *   hurdle-poisson/-negbin
 *                        y = 0: 1 - p;  y > 0: p f(y) / (1 - f(0))
 *                                                 zeroProb = p, the probability of a non-zero count
 *
 * Cumulative sums run on the log scale (each term from the previous by the
 * ratio f(k + 1) / f(k)), so no term underflows before it is added.
 */
import type { Distribution } from '../../model/spec';
import type { FitOutcome } from '../types';
import type { CountKind } from './count-density';
import { countLogPmf } from './count-density';
import { log1mExp, logSumExp } from './observation-terms';

export type CountDistribution = Exclude<Distribution, 'quasipoisson'>;

export interface PmfParameters {
  /** Count-part mean (> 0). */
  readonly mu: number;
  /** Negative-binomial size; ignored for Poisson types. */
  readonly theta?: number | null;
  /** Zero part: ZI probability of an extra zero, hurdle probability of a non-zero count. */
  readonly zeroProb?: number;
}

function countKindOf(d: CountDistribution): CountKind {
  return d === 'negbin' || d === 'zinb' || d === 'hurdle-negbin' ? 'negbin' : 'poisson';
}

function thetaOf(d: CountDistribution, p: PmfParameters): number {
  if (countKindOf(d) === 'poisson') return Number.POSITIVE_INFINITY;
  const t = p.theta;
  if (t === null || t === undefined || !(t > 0)) throw new RangeError(`The ${d} distribution needs a positive theta.`);
  return t;
}

function zeroProbOf(d: CountDistribution, p: PmfParameters): number {
  const z = p.zeroProb;
  if (z === undefined || !(z >= 0 && z <= 1)) throw new RangeError(`The ${d} distribution needs a zero-part probability between 0 and 1.`);
  return z;
}

/** log of sum_{k = from}^{y} f(k) for the count part. */
function logCountSum(kind: CountKind, from: number, y: number, mu: number, theta: number): number {
  if (y < from) return Number.NEGATIVE_INFINITY;
  let term = countLogPmf(kind, from, mu, theta);
  let acc = term;
  const logRatio = kind === 'poisson' ? Math.log(mu) : -Math.log1p(theta / mu);
  for (let k = from; k < y; k++) {
    term += logRatio + (kind === 'poisson' ? -Math.log(k + 1) : Math.log((k + theta) / (k + 1)));
    acc = logSumExp(acc, term);
  }
  return acc;
}

function isCount(y: number): boolean {
  return y >= 0 && Number.isInteger(y);
}

/** log P(Y = y); -Infinity for a y that is not a count. */
export function logProbabilityMass(d: CountDistribution, y: number, p: PmfParameters): number {
  if (!isCount(y)) return Number.NEGATIVE_INFINITY;
  const kind = countKindOf(d);
  const theta = thetaOf(d, p);
  const logF = countLogPmf(kind, y, p.mu, theta);
  if (d === 'poisson' || d === 'negbin') return logF;
  const z = zeroProbOf(d, p);
  if (d === 'zip' || d === 'zinb') {
    const logOne = Math.log1p(-z);
    return y === 0 ? logSumExp(Math.log(z), logOne + logF) : logOne + logF;
  }
  if (y === 0) return Math.log1p(-z);
  return Math.log(z) + logF - log1mExp(countLogPmf(kind, 0, p.mu, theta));
}

/** P(Y = y). */
export function probabilityMass(d: CountDistribution, y: number, p: PmfParameters): number {
  return Math.exp(logProbabilityMass(d, y, p));
}

/** P(Y <= y) (y rounded down; 0 below zero). */
export function cumulativeProbability(d: CountDistribution, y: number, p: PmfParameters): number {
  const top = Math.floor(y);
  if (!(top >= 0)) return 0;
  const kind = countKindOf(d);
  const theta = thetaOf(d, p);
  let out: number;
  if (d === 'poisson' || d === 'negbin') out = Math.exp(logCountSum(kind, 0, top, p.mu, theta));
  else {
    const z = zeroProbOf(d, p);
    if (d === 'zip' || d === 'zinb') out = z + (1 - z) * Math.exp(logCountSum(kind, 0, top, p.mu, theta));
    else {
      const positive = Math.exp(logCountSum(kind, 1, top, p.mu, theta) - log1mExp(countLogPmf(kind, 0, p.mu, theta)));
      out = 1 - z + z * positive;
    }
  }
  return Math.min(1, Math.max(0, out));
}

/**
 * Each used row's log P(y) under a fitted model (for the Vuong test and
 * other per-observation comparisons). Quasi-Poisson has no likelihood.
 */
export function fitLogLikelihoods(fit: Pick<FitOutcome, 'distribution' | 'y' | 'mu' | 'theta' | 'zeroProb'>): Float64Array {
  const d = fit.distribution;
  if (d === 'quasipoisson') throw new RangeError('A quasi-Poisson fit has no likelihood, so it has no per-observation log-likelihoods; use the Poisson fit.');
  const needsZero = d !== 'poisson' && d !== 'negbin';
  if (needsZero && !fit.zeroProb) throw new RangeError(`The ${d} fit carries no zero-part probabilities.`);
  return Float64Array.from(fit.y, (y, i) => logProbabilityMass(d, y, { mu: fit.mu[i], theta: fit.theta, zeroProb: needsZero ? fit.zeroProb![i] : undefined }));
}
