/**
 * The log probability of one count under the Poisson or the negative
 * binomial (NB2: variance mu + mu^2 / theta) distribution, with its first and
 * second derivatives in a = log(mu) and t = log(theta).
 *
 * The zero-inflated and hurdle likelihoods are built from these pieces
 * (./observation-derivatives.ts), so the formulas live here once.
 */
import digamma from '@stdlib/math-base-special-digamma';
import trigamma from '@stdlib/math-base-special-trigamma';
import { lgammaRatio, logFactorial } from '../math/lgamma';

export type CountKind = 'poisson' | 'negbin';

/** Log pmf and derivatives; fields are overwritten by each call (no allocation). */
export interface CountTerms {
  /** log f(y) */
  g: number;
  ga: number;
  gaa: number;
  gt: number;
  gtt: number;
  gat: number;
}

export function newCountTerms(): CountTerms {
  return { g: 0, ga: 0, gaa: 0, gt: 0, gtt: 0, gat: 0 };
}

/**
 * psi(y + theta) - psi(theta) and psi'(y + theta) - psi'(theta) for an
 * integer y >= 0: exact sums for small y, special functions otherwise.
 */
function digammaDifferences(y: number, theta: number): [number, number] {
  if (y < 64) {
    let d1 = 0;
    let d2 = 0;
    for (let k = 0; k < y; k++) {
      const r = 1 / (theta + k);
      d1 += r;
      d2 -= r * r;
    }
    return [d1, d2];
  }
  return [digamma(y + theta) - digamma(theta), trigamma(y + theta) - trigamma(theta)];
}

/** Fills `out` for count y, mean mu (> 0) and, for the negative binomial, size theta. */
export function countTerms(kind: CountKind, y: number, mu: number, theta: number, out: CountTerms): CountTerms {
  if (kind === 'poisson') {
    out.g = countLogPmf(kind, y, mu, theta);
    out.ga = y - mu;
    out.gaa = -mu;
    out.gt = 0;
    out.gtt = 0;
    out.gat = 0;
    return out;
  }
  const s = mu + theta;
  out.g = countLogPmf(kind, y, mu, theta);
  out.ga = (theta * (y - mu)) / s;
  out.gaa = -((y + theta) * mu * theta) / (s * s);
  const [d1, d2] = digammaDifferences(y, theta);
  // d/dtheta log f and d2/dtheta2 log f
  const g1 = d1 - Math.log1p(mu / theta) + (mu - y) / s;
  const g2 = d2 + mu / (theta * s) + (y - mu) / (s * s);
  out.gt = theta * g1;
  out.gtt = theta * g1 + theta * theta * g2;
  out.gat = (theta * (y - mu) * mu) / (s * s);
  return out;
}

/** log f(y) alone (no derivatives). */
export function countLogPmf(kind: CountKind, y: number, mu: number, theta: number): number {
  if (kind === 'poisson') return (y > 0 ? y * Math.log(mu) : 0) - mu - logFactorial(y);
  // theta * log(theta / (mu + theta)) + y * log(mu / (mu + theta)), precise for huge theta.
  const logMu = y > 0 ? -y * Math.log1p(theta / mu) : 0;
  return lgammaRatio(y, theta) - logFactorial(y) - theta * Math.log1p(mu / theta) + logMu;
}
