/**
 * Maximum-likelihood estimate of the negative-binomial size theta for fixed
 * means (NB2, variance mu + mu^2 / theta), by Newton's method on theta from
 * the moment estimate n / sum((y/mu - 1)^2), as in Venables & Ripley,
 * Modern Applied Statistics with S (4th ed., 2002, section 7.4), with a
 * bisection fallback on log(theta) when a Newton step leaves (0, infinity).
 *
 * The digamma and trigamma differences are summed exactly for small counts
 * (psi(t + y) - psi(t) = sum_{k<y} 1/(t + k)), which keeps the score accurate
 * when theta is very large; @stdlib's digamma/trigamma are used otherwise.
 */
import digamma from '@stdlib/math-base-special-digamma';
import trigamma from '@stdlib/math-base-special-trigamma';

/** Above this theta the fit is treated as having no overdispersion. */
export const THETA_MAX = 1e8;

/** d loglik / d theta. */
export function thetaScore(t: number, y: Float64Array, mu: Float64Array, w?: Float64Array | null): number {
  return scoreAndInfo(t, y, mu, w ?? null).score;
}

/** Observed information -d2 loglik / d theta^2. */
export function thetaInfo(t: number, y: Float64Array, mu: Float64Array, w?: Float64Array | null): number {
  return scoreAndInfo(t, y, mu, w ?? null).info;
}

export interface ThetaEstimate {
  /** The estimate; THETA_MAX when it runs to the boundary. */
  readonly theta: number;
  /** 1 / sqrt(observed information) at the estimate. */
  readonly se: number;
  /** True when theta ran off to infinity (no overdispersion). */
  readonly boundary: boolean;
  readonly iterations: number;
  readonly converged: boolean;
}

/**
 * Score d loglik / d theta and observed information -d2 loglik / d theta^2
 * in one pass over the data.
 */
function scoreAndInfo(t: number, y: Float64Array, mu: Float64Array, w: Float64Array | null): { score: number; info: number } {
  let sc = 0;
  let inf = 0;
  for (let i = 0; i < y.length; i++) {
    const yi = y[i];
    const m = mu[i];
    const sm = m + t;
    let psi: number;
    let tri: number;
    if (yi < 64) {
      psi = 0;
      tri = 0;
      for (let k = 0; k < yi; k++) {
        const v = 1 / (t + k);
        psi += v;
        tri += v * v;
      }
    } else {
      psi = digamma(t + yi) - digamma(t);
      tri = trigamma(t) - trigamma(t + yi);
    }
    const wi = w ? w[i] : 1;
    sc += wi * (psi - Math.log1p(m / t) + (m - yi) / sm);
    inf += wi * (tri - (m * m + t * yi) / (t * sm * sm));
  }
  return { score: sc, info: inf };
}

export function thetaML(y: Float64Array, mu: Float64Array, opts: { start?: number; maxIterations?: number; tolerance?: number; weights?: Float64Array | null } = {}): ThetaEstimate {
  const w = opts.weights ?? null;
  const limit = opts.maxIterations ?? 50;
  const eps = opts.tolerance ?? 1e-10;
  let t = opts.start ?? NaN;
  if (!(t > 0 && Number.isFinite(t))) {
    let sw = 0;
    let s = 0;
    for (let i = 0; i < y.length; i++) {
      const wi = w ? w[i] : 1;
      const r = y[i] / mu[i] - 1;
      s += wi * r * r;
      sw += wi;
    }
    t = s > 0 ? sw / s : 1;
    if (!(t > 0 && Number.isFinite(t))) t = 1;
  }
  let it = 0;
  let converged = false;
  while (it < limit) {
    it++;
    const { score: sc, info: inf } = scoreAndInfo(t, y, mu, w);
    const del = sc / inf;
    const next = t + del;
    if (!(inf > 0) || !(next > 0) || !Number.isFinite(next) || next > THETA_MAX) {
      return bisectLogTheta(y, mu, w, it);
    }
    t = next;
    if (Math.abs(del) <= eps * Math.max(1, t)) {
      converged = true;
      break;
    }
  }
  if (!converged) return bisectLogTheta(y, mu, w, it);
  const info = scoreAndInfo(t, y, mu, w).info;
  return { theta: t, se: info > 0 ? 1 / Math.sqrt(info) : NaN, boundary: false, iterations: it, converged };
}

/** Robust fallback: the root of the score in log(theta) on [1e-8, THETA_MAX] by bisection. */
function bisectLogTheta(y: Float64Array, mu: Float64Array, w: Float64Array | null, itSoFar: number): ThetaEstimate {
  let lo = Math.log(1e-8);
  let hi = Math.log(THETA_MAX);
  if (scoreAndInfo(Math.exp(hi), y, mu, w).score > 0) {
    return { theta: THETA_MAX, se: NaN, boundary: true, iterations: itSoFar, converged: true };
  }
  let it = itSoFar;
  for (let k = 0; k < 200 && hi - lo > 1e-13; k++) {
    it++;
    const mid = (lo + hi) / 2;
    if (scoreAndInfo(Math.exp(mid), y, mu, w).score > 0) lo = mid;
    else hi = mid;
  }
  const t = Math.exp((lo + hi) / 2);
  const info = scoreAndInfo(t, y, mu, w).info;
  return { theta: t, se: info > 0 ? 1 / Math.sqrt(info) : NaN, boundary: false, iterations: it, converged: true };
}
