import type { Link } from './types';

/** Smallest mean the log link returns, so that log(mu) stays finite. */
const MU_MIN = 2.220446049250313e-16;

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
