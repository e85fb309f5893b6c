/**
 * Starting values of a bootstrap refit from the full-data fit: the
 * coefficients by name, theta, and the site effects relabelled for the
 * drawn sites (a draw starts from its site's effect in the full fit). The
 * refit converges to its own optimum; the start only saves steps.
 */
import type { FitOutcome, FitStart } from '../engine/types';
import { valuesOfDraws } from './resample-sites';

/** The start a refit takes from a fit (site effects under the fit's own site levels). */
export function startOfFit(fit: Pick<FitOutcome, 'betaNames' | 'beta' | 'gammaNames' | 'gamma' | 'theta' | 'siteEffects'>): FitStart {
  const pairs = (names: readonly string[], values: Float64Array) => new Map(names.map((n, j): [string, number] => [n, values[j]]));
  const sites = fit.siteEffects;
  return {
    beta: pairs(fit.betaNames, fit.beta),
    gamma: pairs(fit.gammaNames, fit.gamma),
    theta: fit.theta,
    siteEffect: sites ? new Map(sites.levels.map((l, g): [string, number] => [l, sites.effect[g]]).filter(([, v]) => Number.isFinite(v))) : new Map(),
  };
}

/** The start for the table of drawn sites (tableOfSites with the same picks). */
export function startOfDraws(start: FitStart, groups: { sites: string[] }, picks: readonly number[]): FitStart {
  return { ...start, siteEffect: valuesOfDraws(start.siteEffect, groups, picks) };
}
