/**
 * Maximum-likelihood fit of a zero-inflated or hurdle model on plain inputs
 * (response, two designs, offset): starting values from simpler fits, then
 * Newton steps on the analytic gradient and Hessian. The covariance is the
 * inverse of the observed information (negative analytic Hessian) at the
 * estimates. Table handling lives in ./fit-zero.ts.
 */
import type { FitControl } from '../types';
import { FitCancelled, wantsInference } from '../types';
import type { ZeroModelData } from './likelihood';
import { evaluateZeroModel, parameterCount } from './likelihood';
import { matVec } from '../linalg/dense';
import { responseMoments } from './moments';
import { newtonMaximize } from './newton-maximize';
import { sigmoid } from './observation-terms';
import { startingValues } from './start-values';

/** log(theta) is held at or below this (theta about 3.3e6): beyond it the count part is Poisson for every purpose. */
export const LOG_THETA_LIMIT = 15;

export interface ZeroCoreFit {
  /** [beta, gamma, log(theta)?] */
  readonly par: Float64Array;
  readonly logLikelihood: number;
  readonly perObservation: Float64Array;
  /** Inverse observed information over all parameters (log(theta) last), or null when singular or not asked for. */
  readonly covariance: Float64Array | null;
  readonly gradient: Float64Array;
  /** Analytic Hessian of the log-likelihood at `par` (k x k, column-major). */
  readonly hessian: Float64Array;
  readonly iterations: number;
  readonly converged: boolean;
  readonly reason: string;
  readonly theta: number | null;
  readonly thetaAtLimit: boolean;
  readonly mu: Float64Array;
  readonly zeroProb: Float64Array;
  readonly expected: Float64Array;
  readonly variance: Float64Array;
}

/** `given`: starting values [beta, gamma, log theta] in place of those from simpler fits. */
export function fitZeroCore(m: ZeroModelData, control: FitControl = {}, given: Float64Array | null = null): ZeroCoreFit {
  const k = parameterCount(m);
  const nb = m.count === 'negbin';
  const maxIterations = control.maxIterations ?? 100;
  if (control.signal?.aborted) throw new FitCancelled();
  control.onProgress?.(0, 'starting values');
  const start = given ?? startingValues(m, control.signal);
  const upper = new Float64Array(k).fill(Number.POSITIVE_INFINITY);
  if (nb) upper[k - 1] = LOG_THETA_LIMIT;
  control.onProgress?.(0.1, 'maximising the likelihood');
  const r = newtonMaximize((x, order) => evaluateZeroModel(m, x, order), start, {
    maxIterations,
    tolerance: control.tolerance ?? 1e-10,
    gradientTolerance: 1e-4,
    upper,
    signal: control.signal,
    inverse: wantsInference(control),
    onIteration: (it) => control.onProgress?.(0.1 + 0.85 * Math.min(1, it / 20), 'maximising the likelihood'),
  });
  const perObservation = new Float64Array(m.y.length);
  evaluateZeroModel(m, r.x, 0, perObservation);
  const theta = nb ? Math.exp(r.x[k - 1]) : null;
  const n = m.y.length;
  const mu = matVec(m.X.data, n, m.X.p, r.x.subarray(0, m.X.p), m.offset).map(Math.exp);
  const zeroProb = matVec(m.Z.data, n, m.Z.p, r.x.subarray(m.X.p, m.X.p + m.Z.p), null).map(sigmoid);
  const expected = new Float64Array(m.y.length);
  const variance = new Float64Array(m.y.length);
  for (let i = 0; i < m.y.length; i++) {
    const mo = responseMoments(m.zero, m.count, mu[i], zeroProb[i], theta ?? Number.POSITIVE_INFINITY);
    expected[i] = mo.mean;
    variance[i] = mo.variance;
  }
  control.onProgress?.(1, 'done');
  return {
    par: r.x,
    logLikelihood: r.value,
    perObservation,
    covariance: r.inverseInformation,
    gradient: r.grad,
    hessian: r.hess,
    iterations: r.iterations,
    converged: r.converged,
    reason: r.reason,
    theta,
    thetaAtLimit: nb && r.atUpperLimit[k - 1],
    mu,
    zeroProb,
    expected,
    variance,
  };
}
