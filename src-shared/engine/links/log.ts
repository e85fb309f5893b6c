import type { Link } from './types';

/** Smallest mean the log link returns, so that log(mu) stays finite. */
export const MU_MIN = 2.220446049250313e-16;

/**
 * log(mu) for mu = max(exp(eta), MU_MIN): eta itself above the floor (it
 * differs from log(exp(eta)) only by the rounding of exp), log(MU_MIN) on it.
 */
export function logMeanAt(eta: number, mu: number): number {
  return mu > MU_MIN ? eta : Math.log(mu);
}

function expFloored(eta: number): number {
  return Math.max(Math.exp(eta), MU_MIN);
}

export const logLink: Link = {
  name: 'log',
  linkfun: (mu) => Math.log(mu),
  linkinv: expFloored,
  muEta: expFloored,
  linkinvAll: (eta, out) => {
    for (let i = 0; i < eta.length; i++) out[i] = expFloored(eta[i]);
  },
};
