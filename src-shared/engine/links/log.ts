import type { Link } from './types';

/** Smallest mean the log link returns, so that log(mu) stays finite. */
const MU_MIN = 2.220446049250313e-16;

export const logLink: Link = {
  name: 'log',
  linkfun: (mu) => Math.log(mu),
  linkinv: (eta) => Math.max(Math.exp(eta), MU_MIN),
  muEta: (eta) => Math.max(Math.exp(eta), MU_MIN),
};
