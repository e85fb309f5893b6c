/**
 * Marginal log-likelihood of a count model with a normal random intercept
 * per site, by adaptive Gauss-Hermite quadrature, and its exact gradient.
 *
 * For site s with rows i, g_s(b) = sum_i l(y_i | eta0_i + b) + log N(b; 0, sigma^2)
 * (l from ./count-derivatives, eta0 = X beta + offset). The conditional
 * mode b_s maximises g_s (Newton; g_s is concave), h_s = -g_s''(b_s), and
 *   L_s = sqrt(2 / h_s) sum_k w_k exp(z_k^2) exp(g_s(b_s + sqrt(2 / h_s) z_k))
 * with the Gauss-Hermite rule (z_k, w_k). One node is the Laplace
 * approximation. Parameters: [beta, log sigma, log theta (negbin only)].
 *
 * Gradient: the nodes move with the parameters through b_s and h_s; their
 * derivatives follow from the implicit function theorem (db/dpar = g_bpar / h,
 * dh/dpar from the third derivative of l), so the gradient is that of the
 * quadrature formula itself, not an approximation to it.
 *
 * Rows must be grouped by site: the rows of site s are start[s]..start[s+1]-1.
 */
import { FitCancelled } from '../types';
import type { FitControl } from '../types';
import digamma from '@stdlib/math-base-special-digamma';
import { countConstant, countD1, countD1Theta, countD2, countD2Theta, countD3, countDTheta, countKernel } from './count-derivatives';
import { gaussHermite } from './gauss-hermite';

export interface GroupedData {
  readonly y: Float64Array;
  /** Column-major n x p fixed-effects design (with intercept). */
  readonly x: Float64Array;
  readonly n: number;
  readonly p: number;
  readonly offset: Float64Array | null;
  /** nSites + 1 row boundaries. */
  readonly start: Int32Array;
  readonly nSites: number;
  readonly negbin: boolean;
}

export interface MarginalEvaluation {
  readonly logLik: number;
  /** Gradient in the parameters (only when asked). */
  readonly gradient: Float64Array | null;
  /** Conditional modes and curvatures -g''(mode) per site. */
  readonly modes: Float64Array;
  readonly curvature: Float64Array;
}

const HALF_LOG_2PI = 0.5 * Math.log(2 * Math.PI);

/**
 * A reusable evaluator: keeps the conditional modes between calls (warm
 * starts) and its scratch buffers.
 */
export function marginalEvaluator(d: GroupedData, quadraturePoints: number, control: FitControl = {}) {
  const { n, p, x, y, start, nSites } = d;
  const rule = gaussHermite(quadraturePoints);
  const K = quadraturePoints;
  const logOmega = Float64Array.from(rule.nodes, (z, k) => Math.log(rule.weights[k]) + z * z);
  const modes = new Float64Array(nSites);
  const curvature = new Float64Array(nSites);
  const eta0 = new Float64Array(n);
  const cst = new Float64Array(n);
  const dig = new Float64Array(n);
  const coef = new Float64Array(n);
  const gk = new Float64Array(K);
  const gpk = new Float64Array(K);
  const pk = new Float64Array(K);
  const nodeAt = new Float64Array(K);
  let cachedTheta = NaN;

  function evaluate(par: Float64Array, wantGradient: boolean): MarginalEvaluation {
    if (control.signal?.aborted) throw new FitCancelled();
    const logSigma = par[p];
    const sigma = Math.exp(logSigma);
    const s2 = sigma * sigma;
    const theta = d.negbin ? Math.exp(par[p + 1]) : Infinity;
    if (theta !== cachedTheta) {
      for (let i = 0; i < n; i++) cst[i] = countConstant(y[i], theta);
      cachedTheta = theta;
      if (d.negbin) for (let i = 0; i < n; i++) dig[i] = y[i] === 0 ? 0 : digamma(y[i] + theta) - digamma(theta);
    }
    for (let i = 0; i < n; i++) eta0[i] = d.offset ? d.offset[i] : 0;
    for (let j = 0; j < p; j++) {
      const bj = par[j];
      const o = j * n;
      for (let i = 0; i < n; i++) eta0[i] += x[o + i] * bj;
    }
    let total = 0;
    let gSigma = 0;
    let gTheta = 0;
    for (let s = 0; s < nSites; s++) {
      const a = start[s];
      const e = start[s + 1];
      // Conditional mode by Newton (concave objective), warm-started.
      let b = modes[s];
      if (!Number.isFinite(b)) b = 0;
      let hess = 0;
      for (let it = 0; it < 100; it++) {
        let g1 = -b / s2;
        let g2 = -1 / s2;
        for (let i = a; i < e; i++) {
          const mu = Math.exp(eta0[i] + b);
          g1 += countD1(y[i], mu, theta);
          g2 += countD2(y[i], mu, theta);
        }
        hess = -g2;
        let step = g1 / hess;
        if (step > 5) step = 5;
        else if (step < -5) step = -5;
        b += step;
        if (Math.abs(step) < 1e-11 * (1 + Math.abs(b))) break;
      }
      // Curvature at the mode, and the third-derivative sums the gradient needs.
      let g2 = -1 / s2;
      let t3 = 0;
      for (let i = a; i < e; i++) {
        const mu = Math.exp(eta0[i] + b);
        g2 += countD2(y[i], mu, theta);
        t3 += countD3(y[i], mu, theta);
      }
      const h = -g2;
      modes[s] = b;
      curvature[s] = h;
      const scale = Math.sqrt(2 / h);
      let cs = 0;
      for (let i = a; i < e; i++) cs += cst[i];
      let mx = -Infinity;
      for (let k = 0; k < K; k++) {
        const u = b + scale * rule.nodes[k];
        nodeAt[k] = u;
        let g = (-u * u) / (2 * s2);
        let gp = -u / s2;
        for (let i = a; i < e; i++) {
          const eta = eta0[i] + u;
          g += countKernel(y[i], eta, theta);
          if (wantGradient) gp += countD1(y[i], Math.exp(eta), theta);
        }
        gk[k] = logOmega[k] + g;
        gpk[k] = gp;
        if (gk[k] > mx) mx = gk[k];
      }
      let sum = 0;
      for (let k = 0; k < K; k++) sum += Math.exp(gk[k] - mx);
      total += cs - logSigma - HALF_LOG_2PI + 0.5 * Math.log(2 / h) + mx + Math.log(sum);
      if (!wantGradient) continue;
      for (let k = 0; k < K; k++) pk[k] = Math.exp(gk[k] - mx) / sum;
      let G1 = 0;
      let G2 = 0;
      const dScale = -0.5 * Math.SQRT2 * h ** -1.5; // d(node offset)/dh per unit z
      for (let k = 0; k < K; k++) {
        G1 += pk[k] * gpk[k];
        G2 += pk[k] * gpk[k] * rule.nodes[k] * dScale;
      }
      const C = G2 - 1 / (2 * h);
      // Per-row coefficient of x_ij in d log L_s / d beta_j.
      let d1ThetaMode = 0;
      let d2ThetaMode = 0;
      for (let i = a; i < e; i++) {
        const muM = Math.exp(eta0[i] + b);
        const l2 = countD2(y[i], muM, theta);
        const l3 = countD3(y[i], muM, theta);
        let c = (G1 * l2) / h - C * (l3 + (t3 * l2) / h);
        for (let k = 0; k < K; k++) c += pk[k] * countD1(y[i], Math.exp(eta0[i] + nodeAt[k]), theta);
        coef[i] = c;
        if (d.negbin) {
          d1ThetaMode += countD1Theta(y[i], muM, theta);
          d2ThetaMode += countD2Theta(y[i], muM, theta);
        }
      }
      // log sigma.
      let eSq = 0;
      for (let k = 0; k < K; k++) eSq += pk[k] * (nodeAt[k] * nodeAt[k]);
      const dbTau = (2 * b) / (s2 * h);
      const dhTau = -t3 * dbTau - 2 / s2;
      gSigma += eSq / s2 - 1 + G1 * dbTau + C * dhTau;
      // log theta.
      if (d.negbin) {
        let lt = 0;
        for (let i = a; i < e; i++) {
          for (let k = 0; k < K; k++) lt += pk[k] * countDTheta(y[i], Math.exp(eta0[i] + nodeAt[k]), theta, dig[i]);
        }
        const dbRho = (theta * d1ThetaMode) / h;
        const dhRho = -theta * d2ThetaMode - t3 * dbRho;
        gTheta += theta * lt + G1 * dbRho + C * dhRho;
      }
    }
    let gradient: Float64Array | null = null;
    if (wantGradient) {
      gradient = new Float64Array(p + (d.negbin ? 2 : 1));
      for (let j = 0; j < p; j++) {
        const o = j * n;
        let s = 0;
        for (let i = 0; i < n; i++) s += x[o + i] * coef[i];
        gradient[j] = s;
      }
      gradient[p] = gSigma;
      if (d.negbin) gradient[p + 1] = gTheta;
    }
    return { logLik: total, gradient, modes: Float64Array.from(modes), curvature: Float64Array.from(curvature) };
  }

  return { evaluate, modes };
}
