/**
 * Maximises a smooth function with its analytic gradient and Hessian:
 * Newton steps with a backtracking (Armijo) line search; where the negative
 * Hessian is not positive definite, or a step cannot be made to climb, a
 * Levenberg-Marquardt ridge (lambda times the diagonal) is added and raised.
 * A parameter with an upper limit (log theta) that sits at its limit with
 * the gradient pointing beyond it is held there (left out of the step and
 * of the convergence check).
 *
 * Convergence needs BOTH a small gradient (every free component smaller
 * than `gradientTolerance` standard errors' worth: |g_j| sqrt(V_jj), V the
 * inverse negative Hessian of the free parameters) AND a small change of the
 * function over the last step (|delta| <= tolerance (1 + |f|)). Nothing is
 * assumed: when the iteration limit or a stuck line search ends the loop,
 * `converged` is false and `reason` says what happened.
 */
import { solveSpd } from '../linalg/dense';
import { FitCancelled, FitInputError } from '../types';
import type { Evaluation } from './likelihood';

export interface MaximizeOptions {
  maxIterations: number;
  /** Relative change of the function value. */
  tolerance: number;
  /** Largest |gradient| in standard-error units. */
  gradientTolerance: number;
  /** Largest absolute change of any parameter in one step. */
  maxStep?: number;
  /** Upper limit per parameter (e.g. log theta), Infinity when none. */
  upper?: Float64Array;
  signal?: { readonly aborted: boolean };
  onIteration?: (iteration: number, value: number) => void;
  /** Invert the final negative Hessian for `inverseInformation` (default true; false leaves it null). */
  inverse?: boolean;
}

export interface MaximizeResult {
  x: Float64Array;
  value: number;
  grad: Float64Array;
  hess: Float64Array;
  /** Inverse of the negative Hessian at x, or null when it is not positive definite. */
  inverseInformation: Float64Array | null;
  iterations: number;
  converged: boolean;
  /** Why the loop stopped, as a plain phrase. */
  reason: string;
  atUpperLimit: boolean[];
}

export type ObjectiveFn = (x: Float64Array, order: 0 | 2) => Evaluation;

/** Solves (-H + ridge diag(|H_jj|)) d = g; null when that matrix is not positive definite or not finite. */
function ridgeStep(h: Float64Array, k: number, ridge: number, g: Float64Array): Float64Array | null {
  const a = new Float64Array(k * k);
  for (let i = 0; i < k * k; i++) {
    a[i] = -h[i];
    if (!Number.isFinite(a[i])) return null;
  }
  if (ridge > 0) for (let j = 0; j < k; j++) a[j * k + j] += ridge * Math.max(Math.abs(a[j * k + j]), 1e-8);
  const sol = solveSpd(a, k, g);
  return sol && sol.x.every(Number.isFinite) ? sol.x : null;
}

/** Inverse of the negative Hessian, column-major, or null when it is not positive definite. */
export function inverseNegativeHessian(h: Float64Array, k: number): Float64Array | null {
  if (k === 0) return new Float64Array(0);
  const a = Float64Array.from(h, (v) => -v);
  if (!a.every(Number.isFinite)) return null;
  const sol = solveSpd(a, k, new Float64Array(k), true);
  if (!sol || !sol.inverse) return null;
  const inv = sol.inverse;
  for (let j = 0; j < k; j++) if (!(inv[j * k + j] > 0) || !Number.isFinite(inv[j * k + j])) return null;
  return inv;
}

/** Indices not held at their upper limit by a gradient pointing beyond it. */
function freeIndices(x: Float64Array, g: Float64Array, upper: Float64Array): number[] {
  const free: number[] = [];
  for (let j = 0; j < x.length; j++) if (!(x[j] >= upper[j] && g[j] > 0)) free.push(j);
  return free;
}

/** The gradient and Hessian restricted to the free indices. */
function restrict(g: Float64Array, h: Float64Array, k: number, free: number[]): { g: Float64Array; h: Float64Array } {
  const m = free.length;
  const gr = Float64Array.from(free, (j) => g[j]);
  const hr = new Float64Array(m * m);
  for (let b = 0; b < m; b++) for (let a = 0; a < m; a++) hr[b * m + a] = h[free[b] * k + free[a]];
  return { g: gr, h: hr };
}

/** Largest |g_j| sqrt(V_jj) over the free parameters, V the inverse negative Hessian among them. */
function scaledGradient(g: Float64Array, h: Float64Array, x: Float64Array, upper: Float64Array): number {
  const k = g.length;
  const free = freeIndices(x, g, upper);
  const r = restrict(g, h, k, free);
  const inv = inverseNegativeHessian(r.h, free.length);
  if (!inv) return Number.POSITIVE_INFINITY;
  let m = 0;
  for (let a = 0; a < free.length; a++) m = Math.max(m, Math.abs(r.g[a]) * Math.sqrt(inv[a * free.length + a]));
  return m;
}

/**
 * Newton (or ridge-damped) direction over the free parameters, zero for those held at a limit;
 * null when the damped matrix is not positive definite.
 */
function direction(g: Float64Array, h: Float64Array, x: Float64Array, upper: Float64Array, ridge: number): Float64Array | null {
  const k = g.length;
  const free = freeIndices(x, g, upper);
  const r = restrict(g, h, k, free);
  const dr = ridgeStep(r.h, free.length, ridge, r.g);
  if (!dr) return null;
  const d = new Float64Array(k);
  free.forEach((j, a) => (d[j] = dr[a]));
  return d;
}

export function newtonMaximize(f: ObjectiveFn, start: Float64Array, opt: MaximizeOptions): MaximizeResult {
  const k = start.length;
  const maxStep = opt.maxStep ?? 5;
  const upper = opt.upper ?? new Float64Array(k).fill(Number.POSITIVE_INFINITY);
  let x = Float64Array.from(start, (v, j) => Math.min(v, upper[j]));
  const ev = f(x, 2);
  if (!Number.isFinite(ev.value) || !ev.grad || !ev.hess) {
    throw new FitInputError('non-finite-start', 'The starting values give a log-likelihood that is not finite, so the fit cannot start. Check the response and offsets for extreme values.');
  }
  let value = ev.value;
  let grad = ev.grad;
  let hess = ev.hess;
  let lastChange = Number.POSITIVE_INFINITY;
  let iterations = 0;
  let converged = false;
  let reason = `the iteration limit (${opt.maxIterations}) was reached`;
  for (; iterations < opt.maxIterations; ) {
    if (opt.signal?.aborted) throw new FitCancelled();
    if (scaledGradient(grad, hess, x, upper) <= opt.gradientTolerance && lastChange <= opt.tolerance * (1 + Math.abs(value))) {
      converged = true;
      reason = 'converged';
      break;
    }
    iterations++;
    let moved = false;
    for (let ridge = 0; ridge <= 1e8 && !moved; ridge = ridge === 0 ? 1e-6 : ridge * 10) {
      const d = direction(grad, hess, x, upper, ridge);
      if (!d) continue;
      let big = 0;
      for (let j = 0; j < k; j++) big = Math.max(big, Math.abs(d[j]));
      const scale = big > maxStep ? maxStep / big : 1;
      let slope = 0;
      for (let j = 0; j < k; j++) slope += grad[j] * d[j] * scale;
      for (let step = scale, tries = 0; tries < 40; tries++, step /= 2) {
        const xn = Float64Array.from(x, (v, j) => Math.min(v + step * d[j], upper[j]));
        // The full step is usually taken, so evaluate it with derivatives at once; shorter trials by value first.
        let evn = f(xn, tries === 0 ? 2 : 0);
        if (!(Number.isFinite(evn.value) && evn.value >= value + 1e-4 * (step / scale) * slope)) continue;
        if (!evn.grad || !evn.hess) evn = f(xn, 2);
        if (!evn.grad || !evn.hess) continue;
        lastChange = Math.abs(evn.value - value);
        x = xn;
        value = evn.value;
        grad = evn.grad;
        hess = evn.hess;
        moved = true;
        break;
      }
    }
    opt.onIteration?.(iterations, value);
    if (!moved) {
      // No step climbs: either at the top already (within rounding) or stuck.
      if (scaledGradient(grad, hess, x, upper) <= opt.gradientTolerance) {
        converged = true;
        reason = 'converged';
      } else {
        reason = 'no step along the Newton or ridge-damped directions increased the log-likelihood';
      }
      break;
    }
  }
  const atUpperLimit = Array.from(x, (v, j) => v >= upper[j]);
  return { x, value, grad, hess, inverseInformation: opt.inverse === false ? null : inverseNegativeHessian(hess, k), iterations, converged, reason, atUpperLimit };
}
