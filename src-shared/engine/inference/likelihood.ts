/** Likelihood-based summaries: log-likelihood, AIC, BIC, deviance, Pearson chi-square. */
import type { Family } from '../families/types';

/** Full log-likelihood (constants included); null for quasi families. */
export function logLikelihood(family: Family, y: Float64Array, mu: Float64Array, w: Float64Array | null = null): number | null {
  const ll = family.logLik;
  if (!ll) return null;
  let s = 0;
  for (let i = 0; i < y.length; i++) s += (w ? w[i] : 1) * ll(y[i], mu[i]);
  return s;
}

/** Total deviance; `eta` as in Family.deviance (the log link's linear predictor, when the caller has it). */
export function totalDeviance(family: Family, y: Float64Array, mu: Float64Array, w: Float64Array | null = null, eta: Float64Array | null = null): number {
  return family.deviance(y, mu, w, eta);
}

/** Sum of squared Pearson residuals (y - mu)^2 / V(mu). */
export function pearsonChi2(family: Family, y: Float64Array, mu: Float64Array): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) {
    const r = y[i] - mu[i];
    s += (r * r) / family.variance(mu[i]);
  }
  return s;
}

/** AIC = -2 logL + 2 k and BIC = -2 logL + k log(n), k counting every estimated parameter. */
export function informationCriteria(logLik: number, k: number, n: number): { aic: number; bic: number } {
  return { aic: -2 * logLik + 2 * k, bic: -2 * logLik + k * Math.log(n) };
}
