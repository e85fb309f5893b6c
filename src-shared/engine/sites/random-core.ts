/**
 * Random site intercept on plain inputs: Poisson or NB2 with a normal
 * intercept per site, the marginal likelihood by adaptive Gauss-Hermite
 * quadrature (./aghq-marginal.ts) maximised over [beta, log sigma,
 * log theta] by BFGS with the exact gradient. Covariance from the inverse of
 * the negative Hessian of the marginal log-likelihood (central differences
 * of the gradient). Conditional modes of the site effects with conditional
 * SDs 1 / sqrt(h_s) (the curvature at the mode).
 *
 * Starting values: a Poisson fit without sites; sigma from the spread of
 * the sites' log observed/fitted totals; theta by maximum likelihood given
 * those means shifted by the site residuals.
 */
import { poissonFamily } from '../families/poisson';
import { irls } from '../irls';
import { solveSpd } from '../linalg/dense';
import { THETA_MAX, thetaML } from '../negbin/theta';
import type { FitControl } from '../types';
import type { GroupedData } from './aghq-marginal';
import { marginalEvaluator } from './aghq-marginal';
import { hessianFromGradient } from './numeric-hessian';
import { maximizeBfgs } from './quasi-newton';
import { groupBySite, type SiteRows } from './site-groups';

/** `x`: the design with its intercept. */
export interface RandomInput extends SiteRows {
  readonly negbin: boolean;
  readonly quadraturePoints: number;
  readonly control?: FitControl;
}

export interface RandomResult {
  readonly beta: Float64Array;
  /** Covariance of all parameters [beta, log sigma, (log theta)], k x k. */
  readonly parameterCovariance: Float64Array;
  /** Covariance of beta alone (p x p). */
  readonly covariance: Float64Array;
  readonly sigma: number;
  readonly theta: number | null;
  readonly logLik: number;
  /** Per site: conditional mode and conditional SD. */
  readonly modes: Float64Array;
  readonly modeSd: Float64Array;
  /** Per input row: conditional mean exp(x beta + offset + mode). */
  readonly mu: Float64Array;
  readonly iterations: number;
  readonly converged: boolean;
  /** The Hessian was not negative definite; the BFGS approximation was used. */
  readonly hessianFallback: boolean;
}

function permuteColumns(x: Float64Array, n: number, p: number, order: Int32Array): Float64Array {
  const out = new Float64Array(n * p);
  for (let j = 0; j < p; j++) {
    const o = j * n;
    for (let i = 0; i < n; i++) out[o + i] = x[o + order[i]];
  }
  return out;
}

function startingValues(g: GroupedData): Float64Array {
  const fit = irls({ x: g.x, n: g.n, p: g.p, y: g.y, offset: g.offset, family: poissonFamily, control: { maxIterations: 50 } });
  const k = g.p + (g.negbin ? 2 : 1);
  const par = new Float64Array(k);
  par.set(fit.beta);
  const resid = new Float64Array(g.nSites);
  let mean = 0;
  for (let s = 0; s < g.nSites; s++) {
    let yy = 0;
    let mm = 0;
    for (let i = g.start[s]; i < g.start[s + 1]; i++) {
      yy += g.y[i];
      mm += fit.mu[i];
    }
    resid[s] = Math.log((yy + 0.5) / (mm + 0.5));
    mean += resid[s] / g.nSites;
  }
  let v = 0;
  for (let s = 0; s < g.nSites; s++) v += (resid[s] - mean) ** 2 / Math.max(1, g.nSites - 1);
  par[g.p] = Math.log(Math.max(0.1, Math.sqrt(v)));
  if (g.negbin) {
    const mu = new Float64Array(g.n);
    for (let s = 0; s < g.nSites; s++) for (let i = g.start[s]; i < g.start[s + 1]; i++) mu[i] = fit.mu[i] * Math.exp(resid[s] - mean);
    const est = thetaML(g.y, mu);
    par[g.p + 1] = Math.log(est.boundary ? 100 : Math.min(est.theta, 1e4));
  }
  return par;
}

export function fitRandomCore(inp: RandomInput): RandomResult {
  const control = inp.control ?? {};
  const { n, p } = inp;
  const { order, start } = groupBySite(inp.site, inp.nSites);
  const g: GroupedData = {
    y: Float64Array.from(order, (i) => inp.y[i]),
    x: permuteColumns(inp.x, n, p, order),
    n,
    p,
    offset: inp.offset ? Float64Array.from(order, (i) => inp.offset![i]) : null,
    start,
    nSites: inp.nSites,
    negbin: inp.negbin,
  };
  control.onProgress?.(0, 'starting values');
  const par0 = startingValues(g);
  const ev = marginalEvaluator(g, inp.quadraturePoints, control);
  const objective = (par: Float64Array) => {
    const r = ev.evaluate(par, true);
    return { value: r.logLik, gradient: r.gradient! };
  };
  const opt = maximizeBfgs(objective, par0, { control, stage: 'marginal likelihood', maxIterations: control.maxIterations ?? 300, gradientTolerance: control.tolerance ?? 1e-6 });
  control.onProgress?.(0.92, 'standard errors');
  const H = hessianFromGradient((par) => ev.evaluate(par, true).gradient!, opt.par);
  const k = opt.par.length;
  const negH = H.map((v) => -v);
  const solved = solveSpd(negH, k, new Float64Array(k), true);
  const cov = solved ? solved.inverse! : opt.inverseHessian;
  const final = ev.evaluate(opt.par, false);
  const covBeta = new Float64Array(p * p);
  for (let j = 0; j < p; j++) for (let i = 0; i < p; i++) covBeta[j * p + i] = cov[j * k + i];
  const modeSd = Float64Array.from(final.curvature, (h) => 1 / Math.sqrt(h));
  const mu = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    let eta = inp.offset ? inp.offset[i] : 0;
    for (let j = 0; j < p; j++) eta += inp.x[j * n + i] * opt.par[j];
    mu[i] = Math.exp(eta + final.modes[inp.site[i]]);
  }
  const theta = inp.negbin ? Math.min(Math.exp(opt.par[p + 1]), THETA_MAX) : null;
  return {
    beta: opt.par.slice(0, p),
    parameterCovariance: cov,
    covariance: covBeta,
    sigma: Math.exp(opt.par[p]),
    theta,
    logLik: final.logLik,
    modes: final.modes,
    modeSd,
    mu,
    iterations: opt.iterations,
    converged: opt.converged && !!solved,
    hessianFallback: !solved,
  };
}
