/**
 * Per-observation log-likelihood of a count under a log link, and its
 * derivatives in the linear predictor eta (orders 1 to 3) and in the
 * negative-binomial size theta. Poisson is theta = Infinity.
 *
 * NB2: l = lgamma(y + theta) - lgamma(theta) - lgamma(y + 1)
 *          + theta log theta + y eta - (y + theta) log(theta + mu),  mu = exp(eta).
 * The eta-free part is computed once per theta by `countConstant`.
 */
import { lgammaRatio, logFactorial } from '../math/lgamma';

/** The part of l that does not depend on eta. */
export function countConstant(y: number, theta: number): number {
  if (theta === Infinity) return -logFactorial(y);
  return lgammaRatio(y, theta) - logFactorial(y) + theta * Math.log(theta);
}

/** l minus its eta-free part. */
export function countKernel(y: number, eta: number, theta: number): number {
  const mu = Math.exp(eta);
  if (theta === Infinity) return y * eta - mu;
  return y * eta - (y + theta) * Math.log(theta + mu);
}

/** dl/deta. */
export function countD1(y: number, mu: number, theta: number): number {
  if (theta === Infinity) return y - mu;
  return y - ((y + theta) * mu) / (theta + mu);
}

/** d2l/deta2 (observed; always negative). */
export function countD2(y: number, mu: number, theta: number): number {
  if (theta === Infinity) return -mu;
  const s = theta + mu;
  return (-(y + theta) * mu * theta) / (s * s);
}

/** d3l/deta3. */
export function countD3(y: number, mu: number, theta: number): number {
  if (theta === Infinity) return -mu;
  const s = theta + mu;
  return (-(y + theta) * theta * mu * (theta - mu)) / (s * s * s);
}

/** Expected information weight E[-d2l/deta2] = mu / (1 + mu / theta). */
export function countWeight(mu: number, theta: number): number {
  return theta === Infinity ? mu : mu / (1 + mu / theta);
}

/** dl/dtheta at fixed eta, less the y-dependent digamma part given separately. */
export function countDTheta(y: number, mu: number, theta: number, digammaDiff: number): number {
  const s = theta + mu;
  return digammaDiff + Math.log(theta) + 1 - Math.log(s) - (y + theta) / s;
}

/** d/dtheta of dl/deta. */
export function countD1Theta(y: number, mu: number, theta: number): number {
  const s = theta + mu;
  return (mu * (y - mu)) / (s * s);
}

/** d/dtheta of d2l/deta2. */
export function countD2Theta(y: number, mu: number, theta: number): number {
  const s = theta + mu;
  return (-mu * (2 * theta * mu + y * mu - theta * y)) / (s * s * s);
}
