import type { Link } from './types';

const EPS = 2.220446049250313e-16;

/** The logit link, with mu kept inside (eps, 1 - eps). */
function inverseLogit(eta: number): number {
  const p = eta >= 0 ? 1 / (1 + Math.exp(-eta)) : Math.exp(eta) / (1 + Math.exp(eta));
  return Math.min(Math.max(p, EPS), 1 - EPS);
}

export const logitLink: Link = {
  name: 'logit',
  linkfun: (mu) => Math.log(mu / (1 - mu)),
  linkinv: inverseLogit,
  linkinvAll: (eta, out) => {
    for (let i = 0; i < eta.length; i++) out[i] = inverseLogit(eta[i]);
  },
  muEta: (eta) => {
    const e = Math.exp(-Math.abs(eta));
    return Math.max(e / ((1 + e) * (1 + e)), EPS);
  },
};
