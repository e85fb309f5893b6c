import { logLink } from '../links/log';
import { lgammaRatio, logFactorial } from '../math/lgamma';
import type { Family } from './types';
import { signedRoot } from './types';

/**
 * Negative binomial NB2 with known size theta and log link:
 * V(mu) = mu + mu^2 / theta.
 */
export function negbinFamily(theta: number): Family {
  const unitDeviance = (y: number, mu: number): number => {
    const a = y > 0 ? y * Math.log(y / mu) : 0;
    return 2 * (a - (y + theta) * Math.log((y + theta) / (mu + theta)));
  };
  return {
    name: 'negbin',
    link: logLink,
    variance: (mu) => mu + (mu * mu) / theta,
    unitDeviance,
    devianceResidual: (y, mu) => signedRoot(y, mu, unitDeviance(y, mu)),
    logLik: (y, mu) =>
      lgammaRatio(y, theta) - logFactorial(y) - theta * Math.log1p(mu / theta) + (y > 0 ? y * Math.log(mu / (mu + theta)) : 0),
    start: (y) => y + (y === 0 ? 1 / 6 : 0),
    hasDispersion: false,
    theta,
  };
}
