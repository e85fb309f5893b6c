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
 * Those terms depend on the count only, so they are taken once per distinct
 * count (count-table.ts).
 */
import type { CountTable } from './count-table';
import { countTable, digammaSums } from './count-table';

/** Above this theta the fit is treated as having no overdispersion. */
export const THETA_MAX = 1e8;

/** d loglik / d theta. */
export function thetaScore(t: number, y: Float64Array, mu: Float64Array, w?: Float64Array | null): number {
  return scoreAndInfo(t, y, mu, w ?? null, countTable(y, w ?? null)).score;
}

/** Observed information -d2 loglik / d theta^2 (`table`: the count table of y and w, when the caller has it). */
export function thetaInfo(t: number, y: Float64Array, mu: Float64Array, w?: Float64Array | null, table?: CountTable): number {
  return scoreAndInfo(t, y, mu, w ?? null, table ?? countTable(y, w ?? null)).info;
}

export interface ThetaEstimate {
  /** The estimate; THETA_MAX when it runs to the boundary. */
  readonly theta: number;
  /** 1 / sqrt(observed information) at the estimate; NaN when not asked for. */
  readonly se: number;
  /** True when theta ran off to infinity (no overdispersion). */
  readonly boundary: boolean;
  readonly iterations: number;
  readonly converged: boolean;
}

/**
 * Score d loglik / d theta and observed information -d2 loglik / d theta^2
 * in one pass over the data; `table` is the count table of y and w.
 */
function scoreAndInfo(t: number, y: Float64Array, mu: Float64Array, w: Float64Array | null, table: CountTable): { score: number; info: number } {
  let sc = 0;
  let inf = 0;
  for (let i = 0; i < y.length; i++) {
    const yi = y[i];
    const m = mu[i];
    const r = 1 / (m + t);
    const wi = w ? w[i] : 1;
    sc += wi * ((m - yi) * r - Math.log1p(m / t));
    inf -= wi * (m * m + t * yi) * r * r;
  }
  inf /= t;
  const g = digammaSums(table, t);
  return { score: sc + g.psi, info: inf + g.tri };
}

export function thetaML(
  y: Float64Array,
  mu: Float64Array,
  opts: { start?: number; maxIterations?: number; tolerance?: number; weights?: Float64Array | null; table?: CountTable; se?: boolean } = {},
): ThetaEstimate {
  const w = opts.weights ?? null;
  const table = opts.table ?? countTable(y, w);
  const withSe = opts.se ?? true;
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
    const { score: sc, info: inf } = scoreAndInfo(t, y, mu, w, table);
    const del = sc / inf;
    const next = t + del;
    if (!(inf > 0) || !(next > 0) || !Number.isFinite(next) || next > THETA_MAX) {
      return bisectLogTheta(y, mu, w, table, it, withSe);
    }
    t = next;
    if (Math.abs(del) <= eps * Math.max(1, t)) {
      converged = true;
      break;
    }
  }
  if (!converged) return bisectLogTheta(y, mu, w, table, it, withSe);
  const info = withSe ? scoreAndInfo(t, y, mu, w, table).info : NaN;
  return { theta: t, se: info > 0 ? 1 / Math.sqrt(info) : NaN, boundary: false, iterations: it, converged };
}

/** Robust fallback: the root of the score in log(theta) on [1e-8, THETA_MAX] by bisection. */
function bisectLogTheta(y: Float64Array, mu: Float64Array, w: Float64Array | null, table: CountTable, itSoFar: number, withSe: boolean): ThetaEstimate {
  let lo = Math.log(1e-8);
  let hi = Math.log(THETA_MAX);
  if (scoreAndInfo(Math.exp(hi), y, mu, w, table).score > 0) {
    return { theta: THETA_MAX, se: NaN, boundary: true, iterations: itSoFar, converged: true };
  }
  let it = itSoFar;
  for (let k = 0; k < 200 && hi - lo > 1e-13; k++) {
    it++;
    const mid = (lo + hi) / 2;
    if (scoreAndInfo(Math.exp(mid), y, mu, w, table).score > 0) lo = mid;
    else hi = mid;
  }
  const t = Math.exp((lo + hi) / 2);
  const info = withSe ? scoreAndInfo(t, y, mu, w, table).info : NaN;
  return { theta: t, se: info > 0 ? 1 / Math.sqrt(info) : NaN, boundary: false, iterations: it, converged: true };
}
