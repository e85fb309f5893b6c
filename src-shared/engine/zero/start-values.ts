/**
 * Starting values from simpler fits: a Poisson GLM (the shared IRLS) for the
 * count part and a logistic regression (a small Newton fit here, since the
 * shared families have no binomial one) for the zero part.
 *
 * Zero-inflated: Poisson on every row; logistic on "the count is zero".
 * Hurdle: Poisson on the non-zero rows; logistic on "the count is not zero"
 * (already the maximum-likelihood zero part, as the hurdle likelihood
 * separates). log(theta) starts at 0 (theta = 1).
 */
import { poissonFamily } from '../families/poisson';
import { irls } from '../irls';
import { crossprodVec, matVec, weightedCrossprod } from '../linalg/dense';
import type { Design, FitControl, FitStart } from '../types';
import { SITE_TERM_INDEX } from './fixed-sites';
import type { Evaluation, ZeroModelData } from './likelihood';
import type { ObjectiveFn } from './newton-maximize';
import { newtonMaximize } from './newton-maximize';
import { logSigmoid, sigmoid } from './observation-terms';

/** log(theta) of a given start is held below fit-core's LOG_THETA_LIMIT (15), inside the feasible region. */
const LOG_THETA_START_LIMIT = 14;

/** Logistic log-likelihood of 0/1 responses s with gradient and Hessian. */
function logisticObjective(D: Design, s: Float64Array): ObjectiveFn {
  const n = D.n;
  return (gamma: Float64Array, order: 0 | 2): Evaluation => {
    const eta = matVec(D.data, n, D.p, gamma, null);
    const d1 = new Float64Array(n);
    const d2 = new Float64Array(n);
    let value = 0;
    for (let i = 0; i < n; i++) {
      const p = sigmoid(eta[i]);
      value += s[i] > 0 ? logSigmoid(eta[i]) : logSigmoid(-eta[i]);
      d1[i] = s[i] - p;
      d2[i] = -p * (1 - p);
    }
    if (!Number.isFinite(value)) return { value: Number.NEGATIVE_INFINITY, grad: null, hess: null };
    if (order === 0) return { value, grad: null, hess: null };
    return { value, grad: crossprodVec(D.data, n, D.p, d1), hess: weightedCrossprod(D.data, n, D.p, d2) };
  };
}

/** Logistic regression; a start need not be converged (e.g. separation), so estimates are kept moderate. */
export function logisticStart(D: Design, s: Float64Array, signal?: FitControl['signal']): Float64Array {
  if (D.p === 0) return new Float64Array(0);
  const r = newtonMaximize(logisticObjective(D, s), new Float64Array(D.p), {
    maxIterations: 30,
    tolerance: 1e-8,
    gradientTolerance: 1e-4,
    maxStep: 3,
    signal,
  });
  return Float64Array.from(r.x, (v) => Math.max(-15, Math.min(15, v)));
}

export function startingValues(m: ZeroModelData, signal?: FitControl['signal']): Float64Array {
  const hurdle = m.zero === 'hurdle';
  const nonZero = Float64Array.from(m.y, (v) => (v > 0 ? 1 : 0));
  const isZero = Float64Array.from(m.y, (v) => (v === 0 ? 1 : 0));
  const count = irls({
    x: m.X.data,
    n: m.X.n,
    p: m.X.p,
    names: m.X.names,
    y: m.y,
    offset: m.offset,
    priorWeights: hurdle ? nonZero : null,
    family: poissonFamily,
    control: { signal },
  });
  const gamma = logisticStart(m.Z, hurdle ? nonZero : isZero, signal);
  const out = new Float64Array(m.X.p + m.Z.p + (m.count === 'negbin' ? 1 : 0));
  out.set(count.beta, 0);
  out.set(gamma, m.X.p);
  return out;
}

/**
 * Starting values from a given start (e.g. the full-data fit, for a
 * bootstrap refit), matched by column name: [beta, gamma, log theta]. With
 * fixed sites (`site`: the site term's coding) the intercept is the
 * reference site's effect and each site column its effect minus that.
 * Null when a column has no value in the start.
 */
export function givenStart(m: ZeroModelData, start: FitStart, site: { readonly column: string; readonly reference: string } | null): Float64Array | null {
  const out = new Float64Array(m.X.p + m.Z.p + (m.count === 'negbin' ? 1 : 0));
  const ref = site ? start.siteEffect.get(site.reference) : undefined;
  const prefix = site ? `${site.column}=` : '';
  for (let j = 0; j < m.X.p; j++) {
    const name = m.X.names[j];
    let v: number | undefined;
    if (site && name === 'intercept') v = ref;
    else if (site && m.X.termOf[j] === SITE_TERM_INDEX) {
      const e = start.siteEffect.get(name.slice(prefix.length));
      v = e === undefined || ref === undefined ? undefined : e - ref;
    } else v = start.beta.get(name);
    if (v === undefined || !Number.isFinite(v)) return null;
    out[j] = v;
  }
  for (let j = 0; j < m.Z.p; j++) {
    const v = start.gamma.get(m.Z.names[j]);
    if (v === undefined || !Number.isFinite(v)) return null;
    out[m.X.p + j] = v;
  }
  if (m.count === 'negbin') out[out.length - 1] = start.theta !== null && start.theta > 0 ? Math.min(Math.log(start.theta), LOG_THETA_START_LIMIT) : 0;
  return out;
}
