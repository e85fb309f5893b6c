/**
 * Means of the intercept-only ("null") model with the same offsets, for the
 * null deviance, log link:
 * - Poisson-type: in closed form, mu_i = exp(o_i) * sum(y) / sum(exp(o_i));
 * - negative binomial at a given theta: the one coefficient b by Newton's
 *   method on the log-likelihood sum_i [y_i (b + o_i) - (y_i + theta) log(theta + mu_i)],
 *   score sum_i theta (y_i - mu_i) / (theta + mu_i), started from the
 *   Poisson value. With mu_i = exp(b) * exp(o_i) the exponentials of the
 *   offsets are taken once, so a step costs a division per row. The
 *   log-likelihood is concave in b; a step that leaves the bracket the
 *   score's signs have shown is replaced by bisection.
 */
import { MU_MIN } from './links/log';

/** Newton stops when the step in b is below this (absolute, b is a log rate). */
const STEP_TOLERANCE = 1e-12;
const MAX_STEPS = 100;

/** theta null or infinite: Poisson-type. */
export function nullModelMeans(y: Float64Array, offset: Float64Array | null, theta: number | null): Float64Array {
  const n = y.length;
  // exp(o_i - shift) with the largest offset as shift, so that no exponential overflows.
  let shift = 0;
  if (offset) {
    shift = -Infinity;
    for (let i = 0; i < n; i++) if (offset[i] > shift) shift = offset[i];
  }
  const e = new Float64Array(n);
  let sy = 0;
  let se = 0;
  for (let i = 0; i < n; i++) {
    e[i] = offset ? Math.exp(offset[i] - shift) : 1;
    sy += y[i];
    se += e[i];
  }
  // c = exp(b + shift): the mean of a row is c * e_i.
  let logC = Math.log(Math.max(sy, 1e-300) / se);
  if (theta !== null && Number.isFinite(theta)) logC = negbinIntercept(y, e, theta, logC);
  const c = Math.exp(logC);
  const mu = e;
  for (let i = 0; i < n; i++) mu[i] = Math.max(c * e[i], MU_MIN);
  return mu;
}

/** The negative binomial null model's log c, from the Poisson value. */
function negbinIntercept(y: Float64Array, e: Float64Array, theta: number, start: number): number {
  let lo = -Infinity;
  let hi = Infinity;
  let b = start;
  for (let k = 0; k < MAX_STEPS; k++) {
    const c = Math.exp(b);
    let score = 0;
    let info = 0;
    for (let i = 0; i < y.length; i++) {
      const m = c * e[i];
      const r = 1 / (theta + m);
      score += (y[i] - m) * r;
      info += (y[i] + theta) * m * r * r;
    }
    // Both carry a factor theta, which cancels in the step.
    if (score > 0) lo = b;
    else if (score < 0) hi = b;
    else return b;
    let next = b + score / info;
    if (!(next > lo && next < hi)) next = Number.isFinite(lo) && Number.isFinite(hi) ? (lo + hi) / 2 : b + Math.sign(score);
    if (Math.abs(next - b) < STEP_TOLERANCE) return next;
    b = next;
  }
  return b;
}
