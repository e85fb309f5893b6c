/**
 * Fixed site effects, absorbed: the dispatcher's entry for a spec with
 * `site.effect = "fixed"` (poisson, quasipoisson, negbin). One effect per
 * site is estimated without dummy columns (see ./absorbed-core.ts); the site
 * effects absorb the intercept and are not listed in `coefficients` but kept
 * in `siteEffects` for predictions.
 *
 * Counting: `df` counts the covariates kept, one parameter per site in the
 * likelihood and theta (negbin). Sites with only zero counts are left out of
 * the likelihood (their effect is -infinity, their fitted means 0) with an
 * `all-zero-site` warning; their rows stay in `nobs`, as in a dense fit.
 */
import type { DataTable } from '../../data/table';
import type { ModelSpec } from '../../model/spec';
import { BOUNDARY_THETA_SENTENCE } from '../negbin/fit';
import { wantsInference, type FitControl, type FitOutcome, type Warning } from '../types';
import { fitAbsorbedCore } from './absorbed-core';
import { nullModelMeans } from '../null-model';
import { siteFrame } from './site-frame';
import { pearsonChi2, totalDeviance } from '../inference/likelihood';
import { waldRows } from '../inference/wald';
import { sanitizeSummary } from '../summary';
import { countFamily, siteSummary } from './site-summary';

/** Deviance of the intercept-only model with the same offset and theta (theta null = Poisson). */
export function nullDevianceWithOffset(y: Float64Array, offset: Float64Array, theta: number | null): number {
  return totalDeviance(countFamily(theta), y, nullModelMeans(y, offset, theta));
}

function names(list: readonly string[], max = 10): string {
  const shown = list.slice(0, max).map((s) => `"${s}"`).join(', ');
  return list.length > max ? `${shown} and ${list.length - max} more` : shown;
}

export function fitAbsorbedSites(table: DataTable, spec: ModelSpec, control: FitControl = {}): FitOutcome {
  const sf = siteFrame(table, spec, false, 'fixed');
  const d = sf.design;
  const negbin = spec.distribution === 'negbin';
  const core = fitAbsorbedCore({
    y: sf.y,
    x: d.data,
    n: d.n,
    p: d.p,
    offset: sf.hasOffset ? sf.offset : null,
    site: sf.site,
    nSites: sf.levels.length,
    family: negbin ? 'negbin' : 'poisson',
    control,
    ...(control.start
      ? {
          start: {
            beta: Float64Array.from(d.names, (nm) => control.start!.beta.get(nm) ?? Number.NaN),
            alpha: Float64Array.from(sf.levels, (l) => control.start!.siteEffect.get(l) ?? Number.NaN),
            theta: control.start.theta,
          },
        }
      : {}),
  });
  const warnings: Warning[] = [...sf.warnings];
  for (const j of core.withinSite) {
    warnings.push({
      code: 'aliased-column',
      message: `Column "${d.names[j]}" does not vary within any site, so its effect cannot be told apart from the fixed site effects; it was dropped. Use random site effects to estimate it.`,
    });
  }
  for (const j of core.dependent) {
    warnings.push({
      code: 'aliased-column',
      message: `Column "${d.names[j]}" is, within sites, a linear combination of earlier columns, so its effect cannot be told apart from theirs and the site effects; it was dropped.`,
    });
  }
  if (core.zeroSites.length) {
    const zs = core.zeroSites.map((s) => sf.levels[s]);
    warnings.push({
      code: 'all-zero-site',
      message: `${zs.length} site${zs.length > 1 ? 's have' : ' has'} only zero counts (${names(zs)}): ${zs.length > 1 ? 'their effects are' : 'its effect is'} minus infinity, so ${zs.length > 1 ? 'they were' : 'it was'} left out of the likelihood and ${zs.length > 1 ? 'their' : 'its'} fitted counts are 0.`,
    });
  }
  if (core.thetaAtBound) warnings.push({ code: 'boundary-theta', message: `The negative-binomial size ran to its upper bound: ${BOUNDARY_THETA_SENTENCE}. The Poisson fit is shown.` });
  if (!core.converged) warnings.push({ code: 'not-converged', message: `The fit with fixed site effects did not converge in ${core.iterations} iterations; the estimates are not reliable. Simplify the model or check the data.` });
  if (spec.robust === 'site') {
    warnings.push({ code: 'other', message: 'Site-robust standard errors are not available with fixed site effects (the site effects already absorb between-site differences); model-based standard errors are shown.' });
  }

  // Per frame row: the mean (0 for all-zero sites).
  const n = d.n;
  const mu = new Float64Array(n);
  core.rows.forEach((r, k) => (mu[r] = core.mu[k]));
  const yUsed = Float64Array.from(core.rows, (r) => sf.y[r]);
  const theta = negbin && !core.thetaAtBound ? core.theta : null;
  const p = core.kept.length;
  const df = p + core.nSitesUsed + (theta !== null ? 1 : 0);
  const dfResidual = n - p - core.nSitesUsed;
  const pearson = pearsonChi2(countFamily(theta), yUsed, core.mu);
  const quasi = spec.distribution === 'quasipoisson';
  const dispersion = quasi ? pearson / Math.max(1, dfResidual) : undefined;
  const covariance = quasi ? core.covariance.map((v) => v * dispersion!) : core.covariance;
  const betaNames = core.kept.map((j) => d.names[j]);
  const inference = wantsInference(control);
  const published = siteSummary({
    distribution: spec.distribution,
    converged: core.converged,
    iterations: core.iterations,
    nobs: n,
    logLik: quasi ? null : core.logLik,
    df,
    deviance: totalDeviance(countFamily(theta), yUsed, core.mu),
    nullDeviance: inference ? nullDevianceWithOffset(sf.y, sf.offset, theta) : null,
    dfResidual,
    pearsonChi2: pearson,
    dispersion,
    theta,
    coefficients: waldRows(betaNames, core.beta, covariance, 0.95, p),
    random: null,
    warnings,
  });
  // Without inference the SEs are NaN: published as empty, as in the other fits.
  const summary = inference ? published : sanitizeSummary(published, false);
  control.onProgress?.(1, 'done');
  return {
    summary,
    distribution: spec.distribution,
    betaNames,
    beta: core.beta,
    gammaNames: [],
    gamma: new Float64Array(0),
    covariance,
    theta,
    rows: Int32Array.from(sf.rows),
    y: sf.y,
    mu,
    expected: mu,
    siteEffects: { levels: sf.levels, effect: core.siteEffect, sd: core.siteSd, siteOfRow: sf.site },
    warnings,
  };
}
