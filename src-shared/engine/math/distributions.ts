/** Normal and chi-square tail probabilities (jstat, default import: see jstat.d.ts), guarded against NaN. */
import jStat from 'jstat';
import gammainc from '@stdlib/math-base-special-gammainc';

/**
 * Upper tail P(Z > z) of the standard normal. Below z = 5 from jstat (whose
 * absolute error, about 1e-16, is then small relative to the tail); from 5 on
 * by Laplace's continued fraction Q(z) = phi(z) / (z + 1/(z + 2/(z + ...))),
 * which keeps full relative accuracy far out in the tail.
 */
export function normalUpper(z: number): number {
  if (z < 5) return jStat.normal.cdf(-z, 0, 1);
  let f = z;
  for (let k = 80; k >= 1; k--) f = z + k / f;
  return Math.exp(-0.5 * z * z) / Math.sqrt(2 * Math.PI) / f;
}

/** Two-sided normal p-value of a z statistic, with relative accuracy in the far tail. */
export function twoSidedNormalP(z: number): number {
  if (!Number.isFinite(z)) return Number.isNaN(z) ? Number.NaN : 0;
  return Math.min(1, 2 * normalUpper(Math.abs(z)));
}

/** The 1 - alpha/2 quantile of the standard normal (1.959964 for alpha = 0.05). */
export function normalQuantile(p: number): number {
  return jStat.normal.inv(p, 0, 1);
}

/**
 * Upper tail P(X > x) of a chi-square with df degrees of freedom: for one df
 * exactly 2 Q(sqrt(x)); otherwise the regularized upper incomplete gamma
 * Q(df/2, x/2) computed directly (not as 1 - cdf), so tiny tails keep their
 * relative accuracy.
 */
export function chiSquareUpper(x: number, df: number): number {
  if (!(x > 0)) return 1;
  if (df === 1) return Math.min(1, 2 * normalUpper(Math.sqrt(x)));
  const p = gammainc(x / 2, df / 2, true, true);
  return Number.isFinite(p) ? Math.min(1, Math.max(0, p)) : 1 - jStat.chisquare.cdf(x, df);
}
