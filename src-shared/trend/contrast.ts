/**
 * Linear combinations of count-part coefficients and their delta-method
 * (here exact, the combination being linear) standard errors from a fit's
 * covariance of [beta, gamma].
 */
import type { FitOutcome } from '../engine/types';
import { TrendError } from './errors';

/** One coefficient and its weight in a combination. */
export interface Weight {
  readonly name: string;
  readonly weight: number;
}

export interface Estimate {
  readonly estimate: number;
  readonly se: number;
}

/** The subset of a fit that contrasts need (crosses workers as plain data). */
export type CoefficientFit = Pick<FitOutcome, 'betaNames' | 'beta' | 'gamma' | 'covariance'>;

/** Position of a count-part coefficient, or -1. */
export function coefficientIndex(fit: CoefficientFit, name: string): number {
  return fit.betaNames.indexOf(name);
}

/** sum_j w_j beta_j and sqrt(w' V w); every name must be a count-part coefficient. */
export function contrast(fit: CoefficientFit, weights: readonly Weight[]): Estimate {
  const k = fit.beta.length + fit.gamma.length;
  const idx: number[] = [];
  const w: number[] = [];
  for (const { name, weight } of weights) {
    const j = coefficientIndex(fit, name);
    if (j < 0) throw new TrendError('missing-coefficient', `The fit has no coefficient "${name}" (its count-part terms are ${fit.betaNames.join(', ')}).`);
    if (weight === 0) continue;
    idx.push(j);
    w.push(weight);
  }
  let estimate = 0;
  let variance = 0;
  for (let a = 0; a < idx.length; a++) {
    estimate += w[a] * fit.beta[idx[a]];
    for (let b = 0; b < idx.length; b++) variance += w[a] * w[b] * fit.covariance[idx[b] * k + idx[a]];
  }
  return { estimate, se: Math.sqrt(Math.max(variance, 0)) };
}
