/**
 * Fixed site effects absorbed, on plain inputs: Poisson, or negative binomial
 * NB2 with theta by maximum likelihood alternating with the absorbed scoring
 * at fixed theta (started from the Poisson fit), until the log-likelihood
 * and theta settle.
 *
 * Before fitting:
 * - sites whose counts are all zero are left out of the likelihood: their
 *   effect's maximum-likelihood estimate is -infinity and their rows then
 *   add exactly 0 to the log-likelihood (common practice: the dense fit
 *   drives those effects towards -infinity with the same log-likelihood);
 * - covariate columns that are constant within every site, or linear
 *   combinations of other columns after within-site centring, cannot be
 *   told apart from the site effects and are dropped.
 *
 * Covariance of beta: the inverse of the Schur-complement information
 * (expected information at the final theta), which is the beta block of the
 * inverse of the full dense information. Site-effect SDs:
 * Var(alpha_s) = 1 / W_s + xbar_s' V xbar_s.
 */
import { findAliased } from '../design/aliasing';
import { solveSpd } from '../linalg/dense';
import { THETA_MAX, thetaML } from '../negbin/theta';
import type { FitControl } from '../types';
import { FitCancelled, FitInputError, wantsInference } from '../types';
import type { AbsorbedState } from './absorbed-newton';
import { absorbedNewton, absorbedWork } from './absorbed-newton';
import { groupBySite, type SiteRows } from './site-groups';

/** `x`: an intercept column, if any, is dropped as aliased. */
export interface AbsorbedInput extends SiteRows {
  readonly family: 'poisson' | 'negbin';
  readonly control?: FitControl;
  /** A start (e.g. the full-data fit): per input column and per input site (NaN where unknown), and theta. */
  readonly start?: { readonly beta: Float64Array; readonly alpha: Float64Array; readonly theta: number | null };
}

/** The start of `input` over the kept columns and the sites with counts, or null when some value is unknown. */
function keptStart(input: AbsorbedInput, kept: readonly number[], newIndex: Int32Array, used: number): { beta: Float64Array; alpha: Float64Array } | null {
  const s = input.start;
  if (!s) return null;
  const beta = Float64Array.from(kept, (j) => s.beta[j]);
  const alpha = new Float64Array(used);
  newIndex.forEach((k, site) => {
    if (k >= 0) alpha[k] = s.alpha[site];
  });
  return beta.every(Number.isFinite) && alpha.every(Number.isFinite) ? { beta, alpha } : null;
}

export interface AbsorbedResult {
  /** Covariate columns kept (indices into the input columns). */
  readonly kept: number[];
  /** Columns dropped: constant within sites, or dependent after within-site centring. */
  readonly withinSite: number[];
  readonly dependent: number[];
  /** Estimates for the kept columns. */
  readonly beta: Float64Array;
  /** Covariance of beta (kept x kept, column-major). */
  readonly covariance: Float64Array;
  /** Per input site: effect (-Infinity for all-zero sites) and its SD (Infinity there). */
  readonly siteEffect: Float64Array;
  readonly siteSd: Float64Array;
  /** Input sites left out because every count is zero. */
  readonly zeroSites: number[];
  /** Input rows used (those of the other sites), grouped by site; the per-row arrays follow this order. */
  readonly rows: Int32Array;
  /** Per used row: the mean. */
  readonly mu: Float64Array;
  readonly theta: number | null;
  readonly thetaSe: number | null;
  readonly thetaAtBound: boolean;
  readonly logLik: number;
  readonly iterations: number;
  readonly converged: boolean;
  /** Sites in the likelihood. */
  readonly nSitesUsed: number;
}

/** Within-site centred copy of the columns (unit weights). */
function centreWithinSites(x: Float64Array, n: number, p: number, site: Int32Array, nSites: number): Float64Array {
  const out = new Float64Array(n * p);
  const count = new Float64Array(nSites);
  for (let i = 0; i < n; i++) count[site[i]]++;
  const mean = new Float64Array(nSites);
  for (let j = 0; j < p; j++) {
    mean.fill(0);
    const o = j * n;
    for (let i = 0; i < n; i++) mean[site[i]] += x[o + i];
    for (let s = 0; s < nSites; s++) mean[s] /= count[s] || 1;
    for (let i = 0; i < n; i++) out[o + i] = x[o + i] - mean[site[i]];
  }
  return out;
}

/** Which columns vary within sites and are not linear combinations of earlier ones there. */
function identifiableColumns(x: Float64Array, n: number, p: number, site: Int32Array, nSites: number) {
  const xc = centreWithinSites(x, n, p, site, nSites);
  const withinSite: number[] = [];
  const varying: number[] = [];
  for (let j = 0; j < p; j++) {
    let a = 0;
    let b = 0;
    for (let i = 0; i < n; i++) {
      a += x[j * n + i] ** 2;
      b += xc[j * n + i] ** 2;
    }
    if (!(b > 1e-20 * a) || b === 0) withinSite.push(j);
    else varying.push(j);
  }
  const sub = new Float64Array(n * varying.length);
  varying.forEach((j, k) => sub.set(xc.subarray(j * n, (j + 1) * n), k * n));
  const dep = new Set(findAliased(sub, n, varying.length).map((k) => varying[k]));
  return { kept: varying.filter((j) => !dep.has(j)), withinSite, dependent: [...dep] };
}

function subsetColumns(x: Float64Array, n: number, rows: Int32Array, cols: number[]): Float64Array {
  const m = rows.length;
  const out = new Float64Array(m * cols.length);
  cols.forEach((j, k) => {
    for (let i = 0; i < m; i++) out[k * m + i] = x[j * n + rows[i]];
  });
  return out;
}

export function fitAbsorbedCore(input: AbsorbedInput): AbsorbedResult {
  const control = input.control ?? {};
  const { n, nSites } = input;
  // Sites with counts, renumbered 0..S'-1; all-zero sites leave the likelihood.
  const siteTotal = new Float64Array(nSites);
  const siteRows = new Float64Array(nSites);
  for (let i = 0; i < n; i++) {
    siteTotal[input.site[i]] += input.y[i];
    siteRows[input.site[i]]++;
  }
  const newIndex = new Int32Array(nSites).fill(-1);
  const zeroSites: number[] = [];
  let used = 0;
  for (let s = 0; s < nSites; s++) {
    if (siteRows[s] === 0) continue;
    if (siteTotal[s] > 0) newIndex[s] = used++;
    else zeroSites.push(s);
  }
  if (used === 0) {
    throw new FitInputError('all-zero-sites', 'Every site has only zero counts, so no site effect can be estimated. Check the response column, or fit without fixed site effects.');
  }
  // Rows of the sites with counts, grouped by site.
  const kept: number[] = [];
  for (let i = 0; i < n; i++) if (newIndex[input.site[i]] >= 0) kept.push(i);
  const grouping = groupBySite(Int32Array.from(kept, (i) => newIndex[input.site[i]]), used);
  const rowList = Array.from(grouping.order, (k) => kept[k]);
  const rows = Int32Array.from(rowList);
  const m = rows.length;
  const site = Int32Array.from(rowList, (i) => newIndex[input.site[i]]);
  const y = Float64Array.from(rowList, (i) => input.y[i]);
  const offset = input.offset ? Float64Array.from(rowList, (i) => input.offset![i]) : null;

  const full = subsetColumns(input.x, n, rows, Array.from({ length: input.p }, (_, j) => j));
  const cols = identifiableColumns(full, m, input.p, site, used);
  const x = subsetColumns(input.x, n, rows, cols.kept);
  const p = cols.kept.length;
  const data = { y, x, n: m, p, offset, site, nSites: used, start: grouping.start };

  control.onProgress?.(0, 'poisson fit with site effects');
  const work = absorbedWork(data);
  const poissonOnly = input.family === 'poisson';
  // For negbin the Poisson fit is only a start: a looser tolerance saves steps.
  const startControl = poissonOnly ? control : { ...control, tolerance: Math.max(control.tolerance ?? 0, 1e-6) };
  // A given start replaces the Poisson fit (for negbin: a step at the given theta).
  const warm = keptStart(input, cols.kept, newIndex, used);
  const theta0 = !poissonOnly && warm && input.start!.theta !== null && input.start!.theta < THETA_MAX ? input.start!.theta : Infinity;
  let state: AbsorbedState = absorbedNewton(data, theta0, warm, startControl, poissonOnly, work);
  let iterations = state.iterations;
  let theta: number | null = null;
  let thetaSe: number | null = null;
  let atBound = false;
  let converged = state.converged;
  if (input.family === 'negbin') {
    const d1 = Math.sqrt(2 * Math.max(1, m - p - used));
    let est = thetaML(y, state.mu, theta0 < Infinity ? { start: theta0 } : {});
    let ll0 = state.logLik;
    let th0 = est.theta;
    converged = false;
    for (let outer = 0; outer < 50; outer++) {
      if (control.signal?.aborted) throw new FitCancelled();
      if (est.boundary || est.theta >= THETA_MAX) {
        atBound = true;
        converged = state.converged;
        break;
      }
      state = absorbedNewton(data, est.theta, { beta: state.beta, alpha: state.alpha }, control, false, work);
      iterations += state.iterations;
      est = thetaML(y, state.mu, { start: est.theta });
      control.onProgress?.(Math.min(0.95, (outer + 1) / 10), 'negative-binomial size');
      const delta = Math.abs(ll0 - state.logLik) / d1 + Math.abs(th0 - est.theta);
      ll0 = state.logLik;
      th0 = est.theta;
      if (delta < 1e-10 * Math.max(1, est.theta)) {
        converged = state.converged;
        break;
      }
    }
    if (atBound) {
      state = absorbedNewton(data, Infinity, { beta: state.beta, alpha: state.alpha }, control, true, work);
      iterations += state.iterations;
      converged = state.converged;
    } else {
      // Final scoring at the final theta so that mu, the log-likelihood and the information agree with it.
      state = absorbedNewton(data, est.theta, { beta: state.beta, alpha: state.alpha }, control, true, work);
      iterations += state.iterations;
      converged = converged && state.converged;
      theta = est.theta;
      thetaSe = est.se;
    }
  }

  // Without inference the factorisation still checks that the information is not singular.
  const inference = wantsInference(control);
  const solved = p > 0 ? solveSpd(state.info, p, new Float64Array(p), inference) : { x: new Float64Array(0), inverse: new Float64Array(0) };
  if (!solved) {
    throw new FitInputError('singular-information', 'The covariates cannot be estimated together with the site effects (the information matrix is singular). Remove covariates that are nearly constant within sites.');
  }
  const cov = inference ? solved.inverse! : new Float64Array(p * p).fill(Number.NaN);
  const siteEffect = new Float64Array(nSites).fill(-Infinity);
  const siteSd = new Float64Array(nSites).fill(Infinity);
  for (let s = 0; s < nSites; s++) {
    const k = newIndex[s];
    if (k < 0) continue;
    siteEffect[s] = state.alpha[k];
    if (!inference) {
      siteSd[s] = Number.NaN;
      continue;
    }
    let q = 0;
    for (let a = 0; a < p; a++) for (let b = 0; b < p; b++) q += state.siteMean[k * p + a] * cov[b * p + a] * state.siteMean[k * p + b];
    siteSd[s] = Math.sqrt(1 / state.siteWeight[k] + q);
  }
  return {
    kept: cols.kept,
    withinSite: cols.withinSite,
    dependent: cols.dependent,
    beta: state.beta,
    covariance: cov,
    siteEffect,
    siteSd,
    zeroSites,
    rows,
    mu: state.mu,
    theta,
    thetaSe,
    thetaAtBound: atBound,
    logLik: state.logLik,
    iterations,
    converged,
    nSitesUsed: used,
  };
}
