/**
 * Iteratively reweighted least squares for a GLM with a known family
 * (Poisson, quasi-Poisson, negative binomial with fixed theta).
 *
 * As in the classical algorithm (McCullagh & Nelder, Generalized Linear
 * Models, 2nd ed., 1989, chapter 2):
 * working response z = eta - offset + (y - mu) / mu'(eta), weights
 * w = prior * mu'(eta)^2 / V(mu), weighted normal equations solved by a
 * Jacobi-scaled Cholesky of X'WX. Converged when
 * |D - D_old| / (|D| + 0.1) < tolerance (default 1e-8, at most 25 steps).
 * A step whose deviance is not finite or rises is halved (up to 30 times).
 * Step-halving is what makes a start from given coefficients safe.
 * A start that gives a non-finite deviance is refused.
 */
import type { Family } from './families/types';
import { totalDeviance } from './inference/likelihood';
import type { ColumnStructure } from './linalg/dense';
import { columnStructure, crossprodVec, matVec, solveSpd, weightedCrossprod } from './linalg/dense';
import type { FitControl, Warning } from './types';
import { FitCancelled, FitInputError } from './types';

export interface IrlsInput {
  /** Column-major n x p design. */
  readonly x: Float64Array;
  readonly n: number;
  readonly p: number;
  readonly names?: readonly string[];
  readonly y: Float64Array;
  /** Added to the linear predictor; null for none. */
  readonly offset: Float64Array | null;
  /** Prior weights (default 1). */
  readonly priorWeights?: Float64Array | null;
  readonly family: Family;
  /** Start from these coefficients (else from the family's starting means). */
  readonly startBeta?: Float64Array;
  /** Start from these means (used when no startBeta). */
  readonly startMu?: Float64Array;
  /**
   * With startBeta: its linear predictor X startBeta + offset and means, as an
   * earlier fit with the same design and offset returned them (copied, not
   * recomputed; they are the same numbers).
   */
  readonly startAt?: { readonly eta: Float64Array; readonly mu: Float64Array };
  /** Scratch arrays of n numbers to use instead of fresh ones (one per fit in a sequence of fits). */
  readonly work?: IrlsWork;
  /**
   * Arrays of n numbers that become the result's eta, mu and weights (else
   * fresh ones). A sequence of fits, each started where the last one ended,
   * can pass the last result's own arrays (they may be startAt's): that
   * result is then overwritten.
   */
  readonly into?: { readonly eta: Float64Array; readonly mu: Float64Array; readonly weights: Float64Array };
  /** The design's column structure, when the caller has it (else computed here). */
  readonly structure?: ColumnStructure;
  /** Compute (X'WX)^-1 at the end (default true); false leaves xtwxInverse empty. */
  readonly covariance?: boolean;
  readonly control?: FitControl;
}

export interface IrlsResult {
  readonly beta: Float64Array;
  readonly eta: Float64Array;
  readonly mu: Float64Array;
  /** Working weights at the final estimates. */
  readonly weights: Float64Array;
  /** (X'WX)^-1 at the final weights: the unscaled covariance (empty when not asked for). */
  readonly xtwxInverse: Float64Array;
  readonly deviance: number;
  readonly iterations: number;
  /** Step-halvings done in all. */
  readonly halvings: number;
  readonly converged: boolean;
  readonly warnings: Warning[];
}

const MAX_HALVINGS = 30;

/** Scratch space of IRLS: overwritten by every fit that is given it, never part of a result. */
export interface IrlsWork {
  readonly z: Float64Array<ArrayBuffer>;
  readonly etaNew: Float64Array<ArrayBuffer>;
}

export function irlsWork(n: number): IrlsWork {
  return { z: new Float64Array(n), etaNew: new Float64Array(n) };
}

/**
 * (X'WX)^-1 with the working weights w = prior * mu'(eta)^2 / V(mu) at the
 * given linear predictor and means; the weights are written to `wOut`.
 */
export function glmCovariance(
  x: Float64Array,
  n: number,
  p: number,
  eta: Float64Array,
  mu: Float64Array,
  family: Family,
  pw: Float64Array | null = null,
  wOut: Float64Array = new Float64Array(n),
  structure?: ColumnStructure,
): Float64Array {
  family.workingWeights(eta, mu, pw, wOut);
  const fin = solveSpd(weightedCrossprod(x, n, p, wOut, undefined, structure), p, new Float64Array(p), true);
  if (!fin || !fin.inverse) {
    throw new FitInputError('singular-information', 'The information matrix at the estimates is singular: some coefficient is not determined by the data. Simplify the model.');
  }
  return fin.inverse;
}

export function irls(input: IrlsInput): IrlsResult {
  const { x, n, p, y, offset, family } = input;
  const pw = input.priorWeights ?? null;
  const control = input.control ?? {};
  const maxIt = control.maxIterations ?? 25;
  const tol = control.tolerance ?? 1e-8;
  const link = family.link;
  const logLinkFast = link.name === 'log';
  const warnings: Warning[] = [];
  // Indicator columns (intercept, factor levels, sites) are handled cell by cell.
  const structure = input.structure ?? columnStructure(x, n, p);

  const eta = input.into?.eta ?? new Float64Array(n);
  const mu = input.into?.mu ?? new Float64Array(n);
  let beta: Float64Array | null = null;
  if (input.startBeta && input.startAt) {
    beta = Float64Array.from(input.startBeta);
    if (input.startAt.eta !== eta) eta.set(input.startAt.eta);
    if (input.startAt.mu !== mu) mu.set(input.startAt.mu);
  } else if (input.startBeta) {
    beta = Float64Array.from(input.startBeta);
    matVec(x, n, p, beta, offset, eta, structure);
    link.linkinvAll(eta, mu);
  } else {
    for (let i = 0; i < n; i++) eta[i] = link.linkfun(input.startMu ? input.startMu[i] : family.start(y[i]));
    link.linkinvAll(eta, mu);
  }
  // With the log link the deviance reads log(mu) from eta.
  const etaOf = (e: Float64Array): Float64Array | null => (logLinkFast ? e : null);
  let devOld = totalDeviance(family, y, mu, pw, etaOf(eta));
  if (!Number.isFinite(devOld)) {
    throw new FitInputError('non-finite-start', 'The starting values give a non-finite deviance, so the fit cannot start. Check the response and offsets for extreme values.');
  }

  const { z, etaNew } = input.work ?? irlsWork(n);
  const w = input.into?.weights ?? new Float64Array(n);
  const xtwx = new Float64Array(p * p);
  const xtwz = new Float64Array(p);
  let converged = false;
  let iterations = 0;
  let dev = devOld;
  let halvedOut = false;
  let totalHalvings = 0;

  for (let iter = 1; iter <= maxIt; iter++) {
    if (control.signal?.aborted) throw new FitCancelled();
    iterations = iter;
    // z holds w * (working response); with the log link mu'(eta) = mu, no second exp.
    family.workingWeights(eta, mu, pw, w);
    for (let i = 0; i < n; i++) {
      const d = logLinkFast ? mu[i] : link.muEta(eta[i]);
      const off = offset ? offset[i] : 0;
      z[i] = w[i] * (eta[i] - off + (y[i] - mu[i]) / d);
    }
    weightedCrossprod(x, n, p, w, xtwx, structure);
    crossprodVec(x, n, p, z, xtwz, structure);
    const sol = solveSpd(xtwx, p, xtwz);
    if (!sol) {
      throw new FitInputError(
        'singular-weights',
        'The weighted normal equations are singular: some coefficient is not determined by the data (for example a level whose rows all have a zero mean). Simplify the model.',
      );
    }
    let betaNew = sol.x;
    matVec(x, n, p, betaNew, offset, etaNew, structure);
    link.linkinvAll(etaNew, mu);
    dev = totalDeviance(family, y, mu, pw, etaOf(etaNew));
    // Step-halving when the deviance is not finite, or rises (from the first step on when
    // the start was given as coefficients, since there is then a previous step to go back to).
    let halvings = 0;
    const canRise = iter > 1 || input.startBeta !== undefined;
    while (beta && (!Number.isFinite(dev) || (canRise && (dev - devOld) / (0.1 + Math.abs(dev)) >= tol))) {
      if (halvings >= MAX_HALVINGS) {
        halvedOut = true;
        break;
      }
      halvings++;
      totalHalvings++;
      const half = new Float64Array(p);
      for (let j = 0; j < p; j++) half[j] = (betaNew[j] + beta[j]) / 2;
      betaNew = half;
      matVec(x, n, p, betaNew, offset, etaNew, structure);
      link.linkinvAll(etaNew, mu);
      dev = totalDeviance(family, y, mu, pw, etaOf(etaNew));
    }
    if (!Number.isFinite(dev)) {
      throw new FitInputError('non-finite-deviance', 'The deviance became non-finite and step-halving could not recover. Check the response and offsets for extreme values.');
    }
    beta = betaNew;
    eta.set(etaNew);
    if (halvedOut) break;
    if (Math.abs(dev - devOld) / (Math.abs(dev) + 0.1) < tol) {
      converged = true;
      break;
    }
    devOld = dev;
    control.onProgress?.(iter / maxIt, 'irls');
  }

  // Weights and (X'WX)^-1 at the final estimates (one more cross-product,
  // so that SEs belong to the estimates and not to the step before them).
  const inverse = input.covariance === false ? new Float64Array(0) : glmCovariance(x, n, p, eta, mu, family, pw, w, structure);
  if (!converged) {
    const what = halvedOut
      ? `the deviance kept rising and ${MAX_HALVINGS} step-halvings did not help`
      : `${iterations} iterations of reweighted least squares${totalHalvings ? ` with ${totalHalvings} step-halving${totalHalvings > 1 ? 's' : ''}` : ''} did not bring the relative change in deviance below ${tol}`;
    warnings.push({ code: 'not-converged', message: `The ${family.name} fit did not converge: ${what}. Estimates are from the last step; simplify the model or check for sparse factor levels.` });
  }
  return { beta: beta!, eta, mu, weights: w, xtwxInverse: inverse, deviance: dev, iterations, halvings: totalHalvings, converged, warnings };
}
