/** Wald inference for coefficients: SE, z, two-sided p, 95% limits; rate ratios. */
import type { CoefficientRow } from '../../model/fit-result';
import { normalQuantile, twoSidedNormalP } from '../math/distributions';

/** The 0.975 quantile of the standard normal. */
export const Z_975 = 1.959963984540054;

/**
 * Coefficient rows from estimates and a column-major covariance of dimension
 * `dim` (default: one row and column per name; larger when the covariance
 * also holds further parameters after the listed ones, e.g. log theta).
 */
export function waldRows(names: readonly string[], beta: ArrayLike<number>, cov: Float64Array, level = 0.95, dim = names.length): CoefficientRow[] {
  const k = dim;
  const q = level === 0.95 ? Z_975 : quantileFor(level);
  return names.map((term, j) => {
    const estimate = beta[j];
    const se = Math.sqrt(Math.max(cov[j * k + j], 0));
    const z = estimate / se;
    return { term, estimate, se, z, p: twoSidedNormalP(z), lower: estimate - q * se, upper: estimate + q * se };
  });
}

function quantileFor(level: number): number {
  return normalQuantile(1 - (1 - level) / 2);
}

export interface RateRatio {
  term: string;
  /** exp(estimate): the multiplicative change in the expected count. */
  ratio: number;
  lower: number;
  upper: number;
}

/** Rate ratios exp(b) with limits exp(lower), exp(upper); the intercept row is left out. */
export function rateRatios(rows: readonly CoefficientRow[]): RateRatio[] {
  return rows.filter((r) => r.term !== 'intercept').map((r) => ({ term: r.term, ratio: Math.exp(r.estimate), lower: Math.exp(r.lower), upper: Math.exp(r.upper) }));
}

/** Scales a covariance matrix in place (e.g. by the quasi-Poisson dispersion). */
export function scaleCovariance(cov: Float64Array, factor: number): Float64Array {
  for (let i = 0; i < cov.length; i++) cov[i] *= factor;
  return cov;
}
