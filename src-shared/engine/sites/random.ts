/**
 * Random site intercept: the dispatcher's entry for a spec with
 * `site.effect = "random"` (poisson, negbin). The marginal likelihood is
 * integrated by adaptive Gauss-Hermite quadrature with
 * `site.quadraturePoints` nodes (1 = Laplace); see ./random-core.ts.
 *
 * Summary: `random: { column, sd }`; `logLikelihood` is the (approximated)
 * marginal log-likelihood with constants; `df` counts the fixed effects,
 * the random-effect SD and theta. `deviance` and `nullDeviance` are null
 * (a marginal model has no saturated counterpart); `pearsonChi2` uses the
 * conditional means (site modes included), which are also `mu` and
 * `expected`. The site modes and their conditional SDs are in
 * `siteEffects`.
 */
import type { DataTable } from '../../data/table';
import type { ModelSpec } from '../../model/spec';
import { BOUNDARY_THETA_SENTENCE } from '../negbin/fit';
import { THETA_MAX } from '../negbin/theta';
import type { FitControl, FitOutcome, Warning } from '../types';
import { FitInputError } from '../types';
import { centreColumns, uncentre } from './centring';
import { fitRandomCore } from './random-core';
import { siteFrame } from './site-frame';
import { pearsonChi2 } from '../inference/likelihood';
import { waldRows } from '../inference/wald';
import { countFamily, siteSummary } from './site-summary';

/** Below this SD the random site effect is reported as at its boundary (zero). */
const SD_FLOOR = 1e-3;

export function fitRandomSite(table: DataTable, spec: ModelSpec, control: FitControl = {}): FitOutcome {
  const sf = siteFrame(table, spec, true, 'random');
  const d = sf.design;
  const negbin = spec.distribution === 'negbin';
  const nSites = sf.levels.length;
  if (nSites < 2) {
    throw new FitInputError('few-sites', `A random site effect needs at least 2 sites, but column "${sf.column}" has ${nSites} in the rows used. Fit without a site effect instead.`);
  }
  const q = spec.site!.quadraturePoints;
  // The optimiser works on centred, unit-scale columns; estimates are mapped back exactly.
  const centring = centreColumns(d.data, d.n, d.p, d.names.indexOf('intercept'));
  const centred = fitRandomCore({
    y: sf.y,
    x: centring.x,
    n: d.n,
    p: d.p,
    offset: sf.hasOffset ? sf.offset : null,
    site: sf.site,
    nSites,
    negbin,
    quadraturePoints: q,
    control,
  });
  const core = { ...centred, ...uncentre(centring, centred.beta, centred.covariance, d.p) };
  const warnings: Warning[] = [...sf.warnings];
  if (nSites < 5) {
    warnings.push({ code: 'few-sites', message: `Only ${nSites} sites: the random-effect SD is poorly determined with so few. Consider fixed site effects.` });
  }
  if (core.sigma < SD_FLOOR) {
    warnings.push({ code: 'other', message: `The random site SD is essentially zero (${core.sigma.toExponential(2)}): the sites do not differ beyond what the covariates explain; a model without site effects fits as well.` });
  }
  if (negbin && core.theta! >= THETA_MAX * 0.999) {
    warnings.push({ code: 'boundary-theta', message: `The negative-binomial size ran to its upper bound: ${BOUNDARY_THETA_SENTENCE}.` });
  }
  if (core.hessianFallback) {
    warnings.push({ code: 'not-converged', message: 'The curvature of the marginal likelihood at the estimates is not that of a maximum; the standard errors are rough. Simplify the model or check the data.' });
  } else if (!core.converged) {
    warnings.push({ code: 'not-converged', message: `The random-site fit did not converge in ${core.iterations} iterations; the estimates are not reliable. Simplify the model or check the data.` });
  }
  if (spec.robust === 'site') {
    warnings.push({ code: 'other', message: 'Site-robust standard errors are not available with a random site effect; model-based standard errors are shown.' });
  }
  const n = d.n;
  const p = d.p;
  const df = p + 1 + (negbin ? 1 : 0);
  const summary = siteSummary({
    distribution: spec.distribution,
    converged: core.converged,
    iterations: core.iterations,
    nobs: n,
    logLik: core.logLik,
    df,
    deviance: null,
    nullDeviance: null,
    dfResidual: n - df,
    pearsonChi2: pearsonChi2(countFamily(core.theta), sf.y, core.mu),
    theta: core.theta,
    coefficients: waldRows(d.names, core.beta, core.covariance, 0.95, p),
    random: { column: sf.column, sd: core.sigma },
    warnings,
  });
  control.onProgress?.(1, 'done');
  return {
    summary,
    distribution: spec.distribution,
    betaNames: d.names,
    beta: core.beta,
    gammaNames: [],
    gamma: new Float64Array(0),
    covariance: core.covariance,
    theta: core.theta,
    rows: Int32Array.from(sf.rows),
    y: sf.y,
    mu: core.mu,
    expected: core.mu,
    siteEffects: { levels: sf.levels, effect: core.modes, sd: core.modeSd, siteOfRow: sf.site },
    warnings,
  };
}
