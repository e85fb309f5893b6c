/**
 * Maximisation by the BFGS quasi-Newton method with a backtracking (Armijo)
 * line search on an objective with an analytic gradient. Stops when the
 * largest gradient entry falls below `gradientTolerance`, or when a step no
 * longer changes the objective.
 */
import type { FitControl } from '../types';
import { FitCancelled } from '../types';

export interface Objective {
  (par: Float64Array): { value: number; gradient: Float64Array };
}

export interface QuasiNewtonResult {
  readonly par: Float64Array;
  readonly value: number;
  readonly gradient: Float64Array;
  readonly iterations: number;
  readonly converged: boolean;
  /** The final BFGS approximation to the inverse of the negative Hessian (k x k). */
  readonly inverseHessian: Float64Array;
}

export interface QuasiNewtonOptions {
  maxIterations?: number;
  gradientTolerance?: number;
  /** Largest change of any parameter in one step. */
  maxStep?: number;
  control?: FitControl;
  stage?: string;
}

function maxAbs(v: Float64Array): number {
  let m = 0;
  for (let i = 0; i < v.length; i++) m = Math.max(m, Math.abs(v[i]));
  return m;
}

export function maximizeBfgs(f: Objective, start: Float64Array, opt: QuasiNewtonOptions = {}): QuasiNewtonResult {
  const k = start.length;
  const maxIt = opt.maxIterations ?? 200;
  const gtol = opt.gradientTolerance ?? 1e-6;
  const maxStep = opt.maxStep ?? 2;
  const control = opt.control ?? {};
  let x = Float64Array.from(start);
  let cur = f(x);
  if (!Number.isFinite(cur.value)) throw new RangeError('The starting values give a non-finite log-likelihood.');
  // H approximates the inverse of the negative Hessian.
  let H = new Float64Array(k * k);
  const resetH = (scale: number) => {
    H = new Float64Array(k * k);
    for (let i = 0; i < k; i++) H[i * k + i] = scale;
  };
  resetH(1 / Math.max(1, maxAbs(cur.gradient)));
  let converged = false;
  let it = 0;
  for (; it < maxIt; it++) {
    if (control.signal?.aborted) throw new FitCancelled();
    if (maxAbs(cur.gradient) < gtol) {
      converged = true;
      break;
    }
    const dir = new Float64Array(k);
    for (let i = 0; i < k; i++) {
      let s = 0;
      for (let j = 0; j < k; j++) s += H[j * k + i] * cur.gradient[j];
      dir[i] = s;
    }
    let slope = 0;
    for (let i = 0; i < k; i++) slope += dir[i] * cur.gradient[i];
    if (!(slope > 0)) {
      resetH(1 / Math.max(1, maxAbs(cur.gradient)));
      for (let i = 0; i < k; i++) dir[i] = H[i * k + i] * cur.gradient[i];
      slope = 0;
      for (let i = 0; i < k; i++) slope += dir[i] * cur.gradient[i];
    }
    const big = maxAbs(dir);
    let t = big > maxStep ? maxStep / big : 1;
    let next: { value: number; gradient: Float64Array } | null = null;
    let xn = new Float64Array(k);
    for (let half = 0; half < 50; half++) {
      for (let i = 0; i < k; i++) xn[i] = x[i] + t * dir[i];
      const cand = f(xn);
      if (Number.isFinite(cand.value) && cand.value >= cur.value + 1e-4 * t * slope) {
        next = cand;
        break;
      }
      t /= 2;
    }
    if (!next) {
      // No ascent along the direction: converged when the gradient is small relative to the objective.
      converged = maxAbs(cur.gradient) < 1e3 * gtol;
      break;
    }
    const s = new Float64Array(k);
    const yv = new Float64Array(k);
    // Ascent: y = -(g_new - g_old) so that y's > 0 for a concave objective.
    for (let i = 0; i < k; i++) {
      s[i] = xn[i] - x[i];
      yv[i] = cur.gradient[i] - next.gradient[i];
    }
    let sy = 0;
    for (let i = 0; i < k; i++) sy += s[i] * yv[i];
    const change = next.value - cur.value;
    x = xn;
    xn = new Float64Array(k);
    cur = next;
    if (sy > 1e-12) {
      if (it === 0) {
        let yy = 0;
        for (let i = 0; i < k; i++) yy += yv[i] * yv[i];
        resetH(sy / yy);
      }
      const Hy = new Float64Array(k);
      for (let i = 0; i < k; i++) {
        let a = 0;
        for (let j = 0; j < k; j++) a += H[j * k + i] * yv[j];
        Hy[i] = a;
      }
      let yHy = 0;
      for (let i = 0; i < k; i++) yHy += yv[i] * Hy[i];
      const c1 = (1 + yHy / sy) / sy;
      for (let j = 0; j < k; j++) {
        for (let i = 0; i < k; i++) {
          H[j * k + i] += c1 * s[i] * s[j] - (Hy[i] * s[j] + s[i] * Hy[j]) / sy;
        }
      }
    }
    control.onProgress?.(Math.min(0.9, (it + 1) / 60), opt.stage ?? 'maximising');
    if (Math.abs(change) < 1e-14 * (Math.abs(cur.value) + 1) && maxAbs(cur.gradient) < 1e3 * gtol) {
      converged = true;
      break;
    }
  }
  return { par: x, value: cur.value, gradient: cur.gradient, iterations: it, converged, inverseHessian: H };
}
