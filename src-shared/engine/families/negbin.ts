import { logLink, logMeanAt } from '../links/log';
import { logCount } from '../math/log-count';
import { lgammaRatio, logFactorial } from '../math/lgamma';
import type { Family } from './types';
import { signedRoot } from './types';

/**
 * Negative binomial NB2 with known size theta and log link:
 * V(mu) = mu + mu^2 / theta.
 */
function nbUnitDeviance(y: number, mu: number, theta: number): number {
  const a = y > 0 ? y * Math.log(y / mu) : 0;
  return 2 * (a - (y + theta) * Math.log((y + theta) / (mu + theta)));
}

export function negbinFamily(theta: number): Family {
  const unitDeviance = (y: number, mu: number): number => nbUnitDeviance(y, mu, theta);
  return {
    name: 'negbin',
    link: logLink,
    variance: (mu) => mu + (mu * mu) / theta,
    // Log link: mu'(eta) = mu.
    workingWeights: (_eta, mu, pw, out) => {
      for (let i = 0; i < mu.length; i++) {
        const d = mu[i];
        out[i] = ((pw ? pw[i] : 1) * d * d) / (d + (d * d) / theta);
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
          const a = yi > 0 ? yi * (logCount(yi) - logMeanAt(eta[i], m)) : 0;
          const d = 2 * (a - (yi + theta) * Math.log((yi + theta) / (m + theta)));
          s += w ? w[i] * d : d;
        }
        return s;
      }
      for (let i = 0; i < y.length; i++) s += w ? w[i] * nbUnitDeviance(y[i], mu[i], theta) : nbUnitDeviance(y[i], mu[i], theta);
      return s;
    },
    devianceResidual: (y, mu) => signedRoot(y, mu, unitDeviance(y, mu)),
    logLik: (y, mu) =>
      lgammaRatio(y, theta) - logFactorial(y) - theta * Math.log1p(mu / theta) + (y > 0 ? y * Math.log(mu / (mu + theta)) : 0),
    start: (y) => y + (y === 0 ? 1 / 6 : 0),
    hasDispersion: false,
    theta,
  };
}
