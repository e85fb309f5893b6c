/**
 * Count regression with one fixed effect per site, the site effects absorbed:
 * Fisher-scoring steps on (beta, alpha) at a fixed negative-binomial size
 * theta (Infinity = Poisson), log link, without building site columns.
 *
 * The site block of the information is diagonal (W_s = sum of the IRLS
 * weights over the site's rows), so the beta step solves the Schur
 * complement  sum_i W_i (x_i - xbar_s)(x_i - xbar_s)' db = sum_i (x_i - xbar_s) r_i
 * with xbar_s the W-weighted site means of the rows' covariates and r_i the
 * score per linear predictor; then da_s = (r_s - m_s' db) / W_s with
 * m_s = sum_i W_i x_i. Cost O(n p^2 + S p) per step, memory O(n p + S p + p^2).
 *
 * Poisson: after each step the site effects are set to their exact profile
 * maximum given beta, alpha_s = log(sum y / sum exp(x b + offset)) over the
 * site's rows, which turns the iteration into Newton on the profiled
 * (conditional, multinomial) likelihood.
 *
 * Rows are grouped by site. The caller has removed sites whose counts are all zero (their effect is
 * -infinity) and columns that are constant within every site (aliased with
 * the site effects).
 */
import { crossprodVec, solveSpd, weightedCrossprod } from '../linalg/dense';
import type { FitControl } from '../types';
import { FitCancelled } from '../types';
import type { SiteRows } from './site-groups';
import { countConstant, countKernel, countWeight } from './count-derivatives';

/** `x` without an intercept; rows grouped by site. */
export interface AbsorbedData extends SiteRows {
  /** nSites + 1 boundaries: the rows of site s are start[s]..start[s+1]-1. */
  readonly start: Int32Array;
}

export interface AbsorbedState {
  readonly beta: Float64Array;
  /** Site effects (log scale). */
  readonly alpha: Float64Array;
  readonly mu: Float64Array;
  /** Full log-likelihood, constants included. */
  readonly logLik: number;
  /** Schur-complement information for beta at the estimates (p x p). */
  readonly info: Float64Array;
  /** Per site: the sum of the IRLS weights W_s. */
  readonly siteWeight: Float64Array;
  /** Per site: W-weighted covariate means (S x p, row s at s * p). */
  readonly siteMean: Float64Array;
  readonly iterations: number;
  readonly converged: boolean;
}

/** Per-row and per-site sums one scoring step needs, in buffers reused across calls on the same data. */
type F64 = Float64Array<ArrayBuffer>;
export interface AbsorbedWork {
  eta: F64;
  mu: F64;
  trialEta: F64;
  trialMu: F64;
  w: F64;
  r: F64;
  xc: F64;
  siteW: F64;
  siteR: F64;
  siteM: F64;
  info: F64;
  constant: number;
}

function linearPredictor(d: AbsorbedData, beta: Float64Array, alpha: Float64Array, eta: Float64Array, mu: Float64Array): void {
  const { n, p, x, offset, site } = d;
  for (let i = 0; i < n; i++) eta[i] = (offset ? offset[i] : 0) + alpha[site[i]];
  for (let j = 0; j < p; j++) {
    const bj = beta[j];
    if (bj === 0) continue;
    const o = j * n;
    for (let i = 0; i < n; i++) eta[i] += x[o + i] * bj;
  }
  for (let i = 0; i < n; i++) mu[i] = Math.exp(eta[i]);
}

function kernelSum(y: Float64Array, eta: Float64Array, theta: number): number {
  let s = 0;
  for (let i = 0; i < y.length; i++) s += countKernel(y[i], eta[i], theta);
  return s;
}

/** Sets each site effect to its exact Poisson profile maximum given beta. */
function profilePoisson(d: AbsorbedData, siteY: Float64Array, alpha: Float64Array, mu: Float64Array, eta: Float64Array): void {
  const m = new Float64Array(d.nSites);
  for (let i = 0; i < d.n; i++) m[d.site[i]] += mu[i];
  const shift = new Float64Array(d.nSites);
  for (let s = 0; s < d.nSites; s++) {
    shift[s] = Math.log(siteY[s] / m[s]);
    alpha[s] += shift[s];
  }
  for (let i = 0; i < d.n; i++) {
    eta[i] += shift[d.site[i]];
    mu[i] = Math.exp(eta[i]);
  }
}

/** IRLS weights, scores, site sums, within-site centred covariates and the Schur information. */
function scoringQuantities(d: AbsorbedData, theta: number, k: AbsorbedWork): void {
  const { n, p, x, y, nSites, start } = d;
  for (let s = 0; s < nSites; s++) {
    let sw = 0;
    let sr = 0;
    for (let i = start[s]; i < start[s + 1]; i++) {
      const mu = k.mu[i];
      const f = theta === Infinity ? 1 : 1 / (1 + mu / theta);
      const w = countWeight(mu, theta);
      k.w[i] = w;
      k.r[i] = (y[i] - mu) * f;
      sw += w;
      sr += k.r[i];
    }
    k.siteW[s] = sw;
    k.siteR[s] = sr;
  }
  for (let j = 0; j < p; j++) {
    const o = j * n;
    for (let s = 0; s < nSites; s++) {
      const a = start[s];
      const e = start[s + 1];
      let m = 0;
      for (let i = a; i < e; i++) m += k.w[i] * x[o + i];
      m /= k.siteW[s];
      k.siteM[s * p + j] = m;
      for (let i = a; i < e; i++) k.xc[o + i] = x[o + i] - m;
    }
  }
  weightedCrossprod(k.xc, n, p, k.w, k.info);
}

/** Scratch buffers for `absorbedNewton` on data of this size. */
export function absorbedWork(d: AbsorbedData): AbsorbedWork {
  const { n, p, nSites } = d;
  return {
    eta: new Float64Array(n),
    mu: new Float64Array(n),
    trialEta: new Float64Array(n),
    trialMu: new Float64Array(n),
    w: new Float64Array(n),
    r: new Float64Array(n),
    xc: new Float64Array(n * p),
    siteW: new Float64Array(nSites),
    siteR: new Float64Array(nSites),
    siteM: new Float64Array(nSites * p),
    info: new Float64Array(p * p),
    constant: 0,
  };
}

export function absorbedNewton(
  d: AbsorbedData,
  theta: number,
  start: { beta: Float64Array; alpha: Float64Array } | null,
  control: FitControl = {},
  /** Compute the information and site sums at the final estimates (false: they belong to the last step's start). */
  finalInfo = true,
  work?: AbsorbedWork,
): AbsorbedState {
  const { n, p, y, nSites } = d;
  const maxIt = control.maxIterations ?? 100;
  const tol = control.tolerance ?? 1e-10;
  const poisson = theta === Infinity;
  const siteY = new Float64Array(nSites);
  for (let i = 0; i < n; i++) siteY[d.site[i]] += y[i];

  const beta = start ? Float64Array.from(start.beta) : new Float64Array(p);
  const alpha = start ? Float64Array.from(start.alpha) : new Float64Array(nSites);
  const k = work ?? absorbedWork(d);
  k.constant = 0;
  for (let i = 0; i < n; i++) k.constant += countConstant(y[i], theta);
  linearPredictor(d, beta, alpha, k.eta, k.mu);
  // Without a start (or for Poisson, always) each site starts at its Poisson profile value given beta.
  if (!start || poisson) profilePoisson(d, siteY, alpha, k.mu, k.eta);
  let ll = kernelSum(y, k.eta, theta);
  const trialBeta = new Float64Array(p);
  const trialAlpha = new Float64Array(nSites);
  const trialEta = k.trialEta;
  const trialMu = k.trialMu;
  let converged = false;
  let it = 0;
  while (it < maxIt) {
    if (control.signal?.aborted) throw new FitCancelled();
    it++;
    scoringQuantities(d, theta, k);
    const g = crossprodVec(k.xc, n, p, k.r);
    let db: Float64Array = new Float64Array(p);
    if (p > 0) {
      const solved = solveSpd(k.info, p, g);
      if (!solved) break;
      db = solved.x;
    }
    const da = new Float64Array(nSites);
    for (let s = 0; s < nSites; s++) {
      let md = 0;
      for (let j = 0; j < p; j++) md += k.siteM[s * p + j] * db[j];
      // siteM holds means: m_s' db = W_s * xbar_s' db.
      da[s] = k.siteR[s] / k.siteW[s] - md;
    }
    let stepLl = -Infinity;
    let t = 1;
    for (let half = 0; half < 40; half++, t /= 2) {
      for (let j = 0; j < p; j++) trialBeta[j] = beta[j] + t * db[j];
      for (let s = 0; s < nSites; s++) trialAlpha[s] = alpha[s] + t * da[s];
      linearPredictor(d, trialBeta, trialAlpha, trialEta, trialMu);
      if (poisson) profilePoisson(d, siteY, trialAlpha, trialMu, trialEta);
      stepLl = kernelSum(y, trialEta, theta);
      if (Number.isFinite(stepLl) && stepLl >= ll - 1e-12 * Math.abs(ll)) break;
    }
    if (!Number.isFinite(stepLl) || stepLl < ll - 1e-12 * Math.abs(ll)) break;
    beta.set(trialBeta);
    alpha.set(trialAlpha);
    k.eta.set(trialEta);
    k.mu.set(trialMu);
    const change = Math.abs(stepLl - ll) / (Math.abs(stepLl + k.constant) + 0.1);
    ll = stepLl;
    control.onProgress?.(Math.min(0.99, it / maxIt), 'site effects');
    if (change < tol) {
      converged = true;
      break;
    }
  }
  if (finalInfo) scoringQuantities(d, theta, k);
  return {
    beta,
    alpha,
    mu: Float64Array.from(k.mu),
    logLik: ll + k.constant,
    info: Float64Array.from(k.info),
    siteWeight: Float64Array.from(k.siteW),
    siteMean: Float64Array.from(k.siteM),
    iterations: it,
    converged,
  };
}
