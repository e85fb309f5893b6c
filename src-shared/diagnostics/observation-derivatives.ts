/**
 * First and second derivatives of one record's log-likelihood with respect
 * to its two linear predictors, eta = log(mu) of the count part and
 * zeta = logit(zeroProb) of the zero part, by central differences of the
 * shared log mass function (../engine/zero/pmf.ts), so one code path serves
 * every distribution. Steps of 1e-4 give about 7 correct digits, plenty for
 * the one-step influence approximation they feed.
 */
import { logProbabilityMass } from '../engine/zero/pmf';
import type { FittedDistribution } from './fitted-distribution';

const H = 1e-4;
/** zeroProb is kept this far from 0 and 1 so that its logit is finite. */
const P_EDGE = 1e-12;

export interface ObservationDerivatives {
  /** d l / d eta, d l / d zeta. */
  readonly g: [number, number];
  /** Minus the Hessian: [[-l_ee, -l_ez], [-l_ez, -l_zz]]. */
  readonly info: [number, number, number];
}

function logistic(z: number): number {
  return 1 / (1 + Math.exp(-z));
}

export function observationDerivatives(dist: FittedDistribution, i: number, y: number, withZero: boolean): ObservationDerivatives {
  const p = dist.parameters(i);
  const eta0 = Math.log(p.mu);
  const z = Math.min(1 - P_EDGE, Math.max(P_EDGE, p.zeroProb ?? 0.5));
  const zeta0 = Math.log(z / (1 - z));
  const f = (de: number, dz: number) =>
    logProbabilityMass(dist.distribution, y, { mu: Math.exp(eta0 + de), theta: p.theta, zeroProb: withZero ? logistic(zeta0 + dz) : undefined });
  const f0 = f(0, 0);
  const fe1 = f(H, 0);
  const fe0 = f(-H, 0);
  const ge = (fe1 - fe0) / (2 * H);
  const iee = -(fe1 - 2 * f0 + fe0) / (H * H);
  if (!withZero) return { g: [ge, 0], info: [iee, 0, 0] };
  const fz1 = f(0, H);
  const fz0 = f(0, -H);
  const gz = (fz1 - fz0) / (2 * H);
  const izz = -(fz1 - 2 * f0 + fz0) / (H * H);
  const iez = -(f(H, H) - f(H, -H) - f(-H, H) + f(-H, -H)) / (4 * H * H);
  return { g: [ge, gz], info: [iee, iez, izz] };
}
