import { logLink, logMeanAt } from '../links/log';
import { logCount } from '../math/log-count';
import { logFactorial } from '../math/lgamma';
import type { Family } from './types';
import { signedRoot } from './types';

function unitDeviance(y: number, mu: number): number {
  return y > 0 ? 2 * (y * Math.log(y / mu) - (y - mu)) : 2 * mu;
}

/** Poisson with log link: V(mu) = mu. */
export const poissonFamily: Family = {
  name: 'poisson',
  link: logLink,
  variance: (mu) => mu,
  // Log link: mu'(eta) = mu.
  workingWeights: (_eta, mu, pw, out) => {
    for (let i = 0; i < mu.length; i++) {
      const d = mu[i];
      out[i] = ((pw ? pw[i] : 1) * d * d) / d;
    }
  },
  unitDeviance,
  deviance: (y, mu, w, eta) => {
    let s = 0;
    if (eta) {
      // y log(y / mu) = y (log y - log mu): log y from the table of counts, log mu from eta.
      for (let i = 0; i < y.length; i++) {
        const yi = y[i];
        const m = mu[i];
        const d = yi > 0 ? 2 * (yi * (logCount(yi) - logMeanAt(eta[i], m)) - (yi - m)) : 2 * m;
        s += w ? w[i] * d : d;
      }
      return s;
    }
    for (let i = 0; i < y.length; i++) s += w ? w[i] * unitDeviance(y[i], mu[i]) : unitDeviance(y[i], mu[i]);
    return s;
  },
  devianceResidual: (y, mu) => signedRoot(y, mu, unitDeviance(y, mu)),
  logLik: (y, mu) => (y > 0 ? y * Math.log(mu) : 0) - mu - logFactorial(y),
  start: (y) => y + 0.1,
  hasDispersion: false,
  theta: null,
};

/** Quasi-Poisson: Poisson mean and variance function, dispersion estimated (Pearson / df residual). */
export const quasiPoissonFamily: Family = {
  ...poissonFamily,
  name: 'quasipoisson',
  logLik: null,
  hasDispersion: true,
};
