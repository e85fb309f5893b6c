import type { Link } from '../links/types';

export type FamilyName = 'poisson' | 'quasipoisson' | 'negbin';

/**
 * An exponential-family description used by IRLS and by inference. Every
 * member is listed so that a family missing one fails to compile.
 */
export interface Family {
  readonly name: FamilyName;
  readonly link: Link;
  /** Variance function V(mu); for quasi families up to the dispersion factor. */
  variance(mu: number): number;
  /**
   * The IRLS working weights out_i = pw_i mu'(eta_i)^2 / V(mu_i) at means
   * mu = g^{-1}(eta) (pw null: unit prior weights), in one loop with no call
   * per observation. With the log link mu'(eta) = mu.
   */
  workingWeights(eta: Float64Array, mu: Float64Array, pw: Float64Array | null, out: Float64Array): void;
  /** Unit deviance d(y, mu) >= 0 (the squared deviance residual). */
  unitDeviance(y: number, mu: number): number;
  /**
   * sum_i w_i d(y_i, mu_i) (w null: unit weights), in one loop with no call
   * per observation. `eta`, when the caller has it: the linear predictor
   * with mu = max(exp(eta), floor) (log link), so that log(mu) is read from
   * it, not computed (see logMeanAt).
   */
  deviance(y: Float64Array, mu: Float64Array, w: Float64Array | null, eta?: Float64Array | null): number;
  /** Signed deviance residual sign(y - mu) * sqrt(d(y, mu)). */
  devianceResidual(y: number, mu: number): number;
  /** Full log-likelihood of one observation, constants included; null when there is no likelihood (quasi). */
  readonly logLik: ((y: number, mu: number) => number) | null;
  /** Starting mean for IRLS from one response value. */
  start(y: number): number;
  /** True when a dispersion factor is estimated from the Pearson statistic (quasi families). */
  readonly hasDispersion: boolean;
  /** Negative-binomial size, null otherwise. */
  readonly theta: number | null;
}

/** sign(y - mu) * sqrt(d): shared by the families. */
export function signedRoot(y: number, mu: number, d: number): number {
  const r = Math.sqrt(Math.max(d, 0));
  return y >= mu ? r : -r;
}
