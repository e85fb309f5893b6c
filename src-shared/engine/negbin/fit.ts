/**
 * Negative binomial (NB2) regression with log link: theta by maximum
 * likelihood alternating with IRLS for beta at fixed theta, started from a
 * Poisson fit (the scheme of Venables & Ripley 2002, section 7.4).
 * Alternation stops when |L - L_old| / d1 + |theta - theta_old| / d2 falls
 * below the tolerance, with d1 = sqrt(2 max(1, df residual)), d2 = 1.
 *
 * Covariance: as commonly reported for this scheme, the SEs of beta come
 * from (X'WX)^-1 with the IRLS weights at the final theta (beta and theta
 * are asymptotically orthogonal in NB2), and the SE of theta from the
 * observed information of theta at the final means, separately.
 *
 * No overdispersion: when sum((y - mu)^2 - y) <= 0 at the Poisson fit the
 * score for alpha = 1/theta at alpha = 0 is not positive and the maximum
 * is on the boundary; so too when theta runs past THETA_MAX. Then the fit
 * is the Poisson fit, `boundary` is true and alpha = 0.
 */
import { negbinFamily } from '../families/negbin';
import { poissonFamily } from '../families/poisson';
import type { IrlsResult } from '../irls';
import { glmCovariance, irls, irlsWork } from '../irls';
import type { ColumnStructure } from '../linalg/dense';
import { columnStructure } from '../linalg/dense';
import { logLikelihood, totalDeviance } from '../inference/likelihood';
import { logMeanAt } from '../links/log';
import type { FitControl, Warning } from '../types';
import { FitCancelled } from '../types';
import { countTable, lgammaRatioSum, logFactorialSum } from './count-table';
import { THETA_MAX, thetaInfo, thetaML } from './theta';

export interface NegbinInput {
  readonly x: Float64Array;
  readonly n: number;
  readonly p: number;
  readonly y: Float64Array;
  readonly offset: Float64Array | null;
  readonly priorWeights?: Float64Array | null;
  /** The design's column structure, when the caller has it (else computed here). */
  readonly structure?: ColumnStructure;
  readonly control?: FitControl;
  /** Compute the covariance of the final fit (default true); false leaves irls.xtwxInverse empty. */
  readonly covariance?: boolean;
}

export interface NegbinResult {
  readonly irls: IrlsResult;
  /** Estimated theta; null on the boundary (theta = infinity). */
  readonly theta: number | null;
  readonly thetaSe: number | null;
  readonly boundary: boolean;
  /** Full log-likelihood at the estimates. */
  readonly logLik: number;
  /** IRLS steps in all, the Poisson start included. */
  readonly iterations: number;
  readonly converged: boolean;
  readonly warnings: Warning[];
}

/**
 * Relative deviance change at which the Poisson start is good enough: it
 * only gives the first means for theta; the alternation then converges to
 * its own criteria (one IRLS step fewer in all than with 1e-4, measured in
 * bench/fit).
 */
const START_TOLERANCE = 1e-2;

export const BOUNDARY_THETA_SENTENCE = 'no overdispersion: the negative binomial reduces to Poisson';

/**
 * Full NB2 log-likelihood at the means and theta: the family's
 * per-observation log-likelihood summed, its Gamma-function and factorial
 * terms taken once per distinct count (`table`: the count table of y and w).
 */
export function negbinLogLik(
  y: Float64Array,
  mu: Float64Array,
  theta: number,
  w: Float64Array | null = null,
  table = countTable(y, w),
  eta: Float64Array | null = null,
): number {
  let s = 0;
  if (eta) {
    // With the linear predictor (log link): log(mu / (mu + theta)) = log(mu) - log(theta) - log1p(mu / theta),
    // log(mu) read from eta, so one logarithm per observation.
    const logTheta = Math.log(theta);
    for (let i = 0; i < y.length; i++) {
      const yi = y[i];
      const m = mu[i];
      const l = Math.log1p(m / theta);
      const v = -theta * l + (yi > 0 ? yi * (logMeanAt(eta[i], m) - logTheta - l) : 0);
      s += w ? w[i] * v : v;
    }
  } else {
    for (let i = 0; i < y.length; i++) {
      const yi = y[i];
      const m = mu[i];
      const v = -theta * Math.log1p(m / theta) + (yi > 0 ? yi * Math.log(m / (m + theta)) : 0);
      s += w ? w[i] * v : v;
    }
  }
  return s + lgammaRatioSum(table, theta) - logFactorialSum(table);
}

export function fitNegbin(input: NegbinInput): NegbinResult {
  const { y } = input;
  const control = input.control ?? {};
  const maxIt = control.maxIterations ?? 25;
  const tol = control.tolerance ?? 1e-8;
  const pw = input.priorWeights ?? null;
  const warnings: Warning[] = [];
  const structure = input.structure ?? columnStructure(input.x, input.n, input.p);
  // One scratch space for the whole sequence of IRLS fits; each fit starts where the last one ended.
  const base = { x: input.x, n: input.n, p: input.p, y, offset: input.offset, priorWeights: pw, control, structure, work: irlsWork(input.n) };

  // The Poisson start only needs to be close: a loose tolerance and no covariance.
  // It is finished properly when it may be the answer (no overdispersion).
  control.onProgress?.(0, 'poisson start');
  let fit = irls({ ...base, family: poissonFamily, control: { ...control, tolerance: Math.max(tol, START_TOLERANCE) }, covariance: false });
  let iterations = fit.iterations;
  const finishPoisson = (from: IrlsResult): IrlsResult => {
    const f = irls({ ...base, family: poissonFamily, startBeta: from.beta, startAt: from, covariance: input.covariance });
    iterations += f.iterations;
    return f;
  };

  const excess = (f: IrlsResult): number => {
    let s = 0;
    for (let i = 0; i < y.length; i++) s += (pw ? pw[i] : 1) * ((y[i] - f.mu[i]) ** 2 - y[i]);
    return s;
  };
  const boundaryOf = (f: IrlsResult): NegbinResult => ({
    irls: f,
      theta: null,
      thetaSe: null,
      boundary: true,
      logLik: logLikelihood(poissonFamily, y, f.mu, pw)!,
      iterations,
      converged: f.converged,
      warnings: [
        ...f.warnings,
        { code: 'boundary-theta', message: `The estimate of theta is on its boundary (theta = infinity, alpha = 0): ${BOUNDARY_THETA_SENTENCE}. The coefficients are those of the Poisson fit.` },
      ],
  });
  const boundaryResult = (start: IrlsResult): NegbinResult => boundaryOf(finishPoisson(start));
  // The boundary is decided at the converged Poisson fit, not at the loose start.
  if (!(excess(fit) > 0)) {
    fit = finishPoisson(fit);
    if (!(excess(fit) > 0)) return boundaryOf(fit);
  }

  const table = countTable(y, pw);
  let th = thetaML(y, fit.mu, { weights: pw, table, se: false });
  if (th.boundary) return boundaryResult(fit);
  const dfRes = Math.max(1, input.n - input.p);
  const d1 = Math.sqrt(2 * dfRes);
  let ll = negbinLogLik(y, fit.mu, th.theta, pw, table, fit.eta);
  let llOld = ll + 2 * d1;
  let del = 1;
  let outer = 0;
  let converged = false;
  while (outer < maxIt) {
    if (Math.abs(llOld - ll) / d1 + Math.abs(del) <= tol) {
      converged = true;
      break;
    }
    if (control.signal?.aborted) throw new FitCancelled();
    outer++;
    // Each alternation's IRLS starts where the last ended and writes over its arrays.
    fit = irls({ ...base, family: negbinFamily(th.theta), startBeta: fit.beta, startAt: fit, into: fit, covariance: false });
    iterations += fit.iterations;
    const t0 = th.theta;
    th = thetaML(y, fit.mu, { weights: pw, start: t0, table, se: false });
    if (th.boundary || th.theta > THETA_MAX) return boundaryResult(fit);
    del = t0 - th.theta;
    llOld = ll;
    ll = negbinLogLik(y, fit.mu, th.theta, pw, table, fit.eta);
    control.onProgress?.(Math.min(0.95, outer / maxIt), 'theta');
  }
  // As in the classical scheme, beta is from the last IRLS (at a theta that differs
  // from the final one by less than the tolerance); its covariance is taken with the
  // weights at the final theta, and SE(theta) from the information at the final means.
  const family = negbinFamily(th.theta);
  // The last IRLS's weights (at the theta before) are not needed any more: overwritten with the final ones.
  const weights = fit.weights;
  const xtwxInverse = input.covariance === false ? new Float64Array(0) : glmCovariance(input.x, input.n, input.p, fit.eta, fit.mu, family, pw, weights, structure);
  fit = { ...fit, xtwxInverse, weights, deviance: totalDeviance(family, y, fit.mu, pw, fit.eta) };
  // SE(theta) from the observed information of theta at the final means.
  const thetaInformation = thetaInfo(th.theta, y, fit.mu, pw, table);
  warnings.push(...fit.warnings);
  if (!converged) {
    warnings.push({
      code: 'not-converged',
      message: `The negative binomial fit did not converge: ${maxIt} alternations of theta and the coefficients left the change in log-likelihood or theta above ${tol}. Estimates are from the last step.`,
    });
  }
  return {
    irls: fit,
    theta: th.theta,
    thetaSe: thetaInformation > 0 ? 1 / Math.sqrt(thetaInformation) : null,
    boundary: false,
    // At the same means and theta as the last alternation's.
    logLik: ll,
    iterations,
    converged: converged && fit.converged,
    warnings,
  };
}
