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
import type { Design, FitControl } from '../types';
import type { Evaluation, ZeroModelData } from './likelihood';
import type { ObjectiveFn } from './newton-maximize';
import { newtonMaximize } from './newton-maximize';
import { logSigmoid, sigmoid } from './observation-terms';

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
