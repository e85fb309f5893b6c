/**
 * Fits a zero-inflated (zip, zinb) or hurdle (hurdle-poisson, hurdle-negbin)
 * model from a table and a spec, and publishes it as the `fit --json`
 * object of shared/cli-contract.md.
 *
 * - Count part: log link on `predictors` (plus the time term of `time`,
 *   ../model-terms.ts) and offsets. Zero part: logit link
 *   on `zeroPredictors` (intercept only when empty); for zip/zinb it is the
 *   probability of an extra zero, for hurdle models the probability of a
 *   non-zero count.
 * - `deviance` and `nullDeviance` are null: a two-part model has no single
 *   saturated model to measure deviance from, so only the log-likelihood,
 *   AIC and BIC are given. `dfResidual` is nobs minus every estimated
 *   parameter (theta included).
 * - `pearsonChi2` uses the mean and variance of the whole model (./moments.ts).
 * - Warnings: non-convergence, theta at its limit, no extra zeros, and
 *   boundary estimates with huge SEs (./fit-warnings.ts).
 * - Fixed site effects: per-site intercepts in the count part (./fixed-sites.ts),
 *   published in `siteEffects`, not among the coefficients. A random site
 *   effect is not supported yet (a clear error says so).
 * - `robust: "site"`: site-clustered sandwich SEs (./site-robust.ts).
 */
import type { DataTable } from '../../data/table';
import { requireColumn } from '../../data/table';
import type { FitSummary } from '../../model/fit-result';
import type { Distribution, ModelSpec } from '../../model/spec';
import { informationCriteria } from '../inference/likelihood';
import { waldRows } from '../inference/wald';
import { sanitizeSummary, warningSentences } from '../summary';
import type { FitControl, FitOutcome, Warning } from '../types';
import { FitInputError, wantsInference } from '../types';
import type { CountKind } from './count-density';
import type { ZeroCoreFit } from './fit-core';
import { fitZeroCore } from './fit-core';
import { fitWarnings, largeErrorWarnings } from './fit-warnings';
import { SITE_TERM_INDEX, siteIntercepts } from './fixed-sites';
import { givenStart } from './start-values';
import type { FactorCoding } from '../design/build';
import type { ZeroModelData } from './likelihood';
import { inverseNegativeHessian } from './newton-maximize';
import type { ZeroKind } from './observation-terms';
import { siteClusteredCovariance } from './site-robust';
import { prepareZeroDesign } from './zero-design';

export interface ZeroModelKind {
  readonly zero: ZeroKind;
  readonly count: CountKind;
  /** Plain words for messages. */
  readonly label: string;
}

const KINDS: Partial<Record<Distribution, ZeroModelKind>> = {
  zip: { zero: 'zero-inflated', count: 'poisson', label: 'zero-inflated Poisson' },
  zinb: { zero: 'zero-inflated', count: 'negbin', label: 'zero-inflated negative binomial' },
  'hurdle-poisson': { zero: 'hurdle', count: 'poisson', label: 'hurdle Poisson' },
  'hurdle-negbin': { zero: 'hurdle', count: 'negbin', label: 'hurdle negative binomial' },
};

/** The two parts of a zero-inflated or hurdle distribution, or null for other distributions. */
export function zeroModelKind(d: Distribution): ZeroModelKind | null {
  return KINDS[d] ?? null;
}

function checkSpec(spec: ModelSpec): ZeroModelKind {
  const kind = zeroModelKind(spec.distribution);
  if (!kind) {
    throw new FitInputError('wrong-distribution', `The distribution "${spec.distribution}" has no zero part; fit it with the ordinary count models, or choose zip, zinb, hurdle-poisson or hurdle-negbin.`);
  }
  if (spec.site?.effect === 'random') {
    throw new FitInputError(
      'unsupported-site',
      `A random site effect ("site": "${spec.site.column}") is not available for ${kind.label} models yet. Use "effect": "fixed", or a poisson or negbin model with the random site effect.`,
    );
  }
  if (spec.robust === 'site' && !spec.site) {
    throw new FitInputError('robust-needs-site', 'Site-robust standard errors need a site column: add "site" to the model spec or set "robust" to "none".');
  }
  return kind;
}

/** Sites below this count make clustered SEs unreliable (Cameron & Miller 2015, section VI). */
const FEW_CLUSTERS = 20;

/** The size x size block of a k x k column-major matrix starting at (from, from). */
function diagonalBlock(m: Float64Array, k: number, from: number, size: number): Float64Array {
  const out = new Float64Array(size * size);
  for (let j = 0; j < size; j++) for (let i = 0; i < size; i++) out[j * size + i] = m[(from + j) * k + from + i];
  return out;
}

/**
 * Covariance of [beta, gamma]: the coefficient block of the full inverse
 * information; with theta at its limit, the inverse of the coefficient
 * block of the information (theta held fixed).
 */
function coefficientCovariance(m: ZeroModelData, fit: ZeroCoreFit): Float64Array | null {
  const k = fit.par.length;
  const kc = m.X.p + m.Z.p;
  if (fit.covariance && !fit.thetaAtLimit) return diagonalBlock(fit.covariance, k, 0, kc);
  if (m.count !== 'negbin') return null;
  return inverseNegativeHessian(diagonalBlock(fit.hessian, k, 0, kc), kc);
}

/** Rows/columns `idx` of a k x k column-major matrix. */
function pick(m: Float64Array, k: number, idx: readonly number[]): Float64Array {
  const q = idx.length;
  const out = new Float64Array(q * q);
  idx.forEach((b, jb) => idx.forEach((a, ja) => (out[jb * q + ja] = m[b * k + a])));
  return out;
}

export function fitZeroModel(table: DataTable, spec: ModelSpec, control: FitControl = {}): FitOutcome {
  const kind = checkSpec(spec);
  const prepared = prepareZeroDesign(table, spec, kind);
  const { frame, X, Z } = prepared;
  const warnings: Warning[] = [...prepared.warnings];
  const data: ZeroModelData = { zero: kind.zero, count: kind.count, y: frame.y, X, Z, offset: frame.offset };
  const siteCoding = spec.site?.effect === 'fixed' ? (prepared.count.levels[SITE_TERM_INDEX] as FactorCoding) : null;
  const fit = fitZeroCore(data, control, control.start ? givenStart(data, control.start, siteCoding) : null);
  const n = frame.y.length;
  const k = fit.par.length;
  const kc = X.p + Z.p;

  warnings.push(...fitWarnings(kind, fit));
  const inference = wantsInference(control);
  let cov = inference ? coefficientCovariance(data, fit) : new Float64Array(kc * kc).fill(Number.NaN);
  if (!cov) {
    throw new FitInputError(
      'singular-information',
      `The information matrix of the ${kind.label} fit is singular, so standard errors cannot be given: some coefficient is not determined by the data (count part: ${X.names.join(', ')}; zero part: ${Z.names.join(', ')}). Simplify the model, e.g. fewer zero-part predictors.`,
    );
  }
  if (inference) warnings.push(...largeErrorWarnings(data, fit.par, cov));
  let seType: FitSummary['seType'] = 'model';
  if (spec.robust === 'site' && spec.site && inference) {
    const texts = requireColumn(table, spec.site.column).texts;
    const robust = siteClusteredCovariance(data, fit, frame.rows.map((r) => texts[r]));
    if (!robust) throw new FitInputError('singular-information', `The information matrix of the ${kind.label} fit is singular, so site-clustered standard errors cannot be given. Simplify the model.`);
    cov = robust.cov;
    seType = 'site-robust';
    warnings.push({
      code: 'robust-se',
      message: `Standard errors are site-clustered sandwich estimates (clustered by "${spec.site.column}", ${robust.clusters} sites, small-sample factor G/(G-1)·(n-1)/(n-k) with k = ${kc + (fit.theta !== null && !fit.thetaAtLimit ? 1 : 0)} parameters), reported in place of the model-based ones.`,
    });
    if (robust.clusters < FEW_CLUSTERS) {
      warnings.push({ code: 'few-sites', message: `Only ${robust.clusters} sites: clustered standard errors are unreliable with so few sites and tend to be too small.` });
    }
  }

  const sites = spec.site?.effect === 'fixed' ? siteIntercepts(table, X, prepared.count.levels, frame.rows, fit.par, cov, kc) : null;
  // Published count coefficients: all but the intercept and site columns when sites are fixed.
  const listed = sites ? sites.listed : X.names.map((_, j) => j);
  const gammaIdx = Z.names.map((_, j) => X.p + j);
  const published = [...listed, ...gammaIdx];
  const covPublished = pick(cov, kc, published);
  const q = published.length;
  const betaNames = listed.map((j) => X.names[j]);
  const beta = Float64Array.from(listed, (j) => fit.par[j]);

  let pearson = 0;
  for (let i = 0; i < n; i++) {
    const r = frame.y[i] - fit.expected[i];
    pearson += (r * r) / Math.max(fit.variance[i], Number.MIN_VALUE);
  }
  const ll = fit.logLikelihood;
  const ic = informationCriteria(ll, k, n);
  const summary: FitSummary = sanitizeSummary({
    converged: fit.converged,
    iterations: fit.iterations,
    nobs: n,
    distribution: spec.distribution,
    logLikelihood: ll,
    aic: ic.aic,
    bic: ic.bic,
    df: k,
    deviance: null,
    nullDeviance: null,
    dfResidual: n - k,
    pearsonChi2: pearson,
    theta: fit.theta,
    alpha: fit.theta === null ? null : 1 / fit.theta,
    coefficients: waldRows(betaNames, beta, diagonalBlock(covPublished, q, 0, listed.length)),
    zeroCoefficients: waldRows(Z.names, fit.par.subarray(X.p, kc), diagonalBlock(covPublished, q, listed.length, Z.p)),
    random: null,
    seType,
    warnings: warningSentences(warnings),
  }, inference);
  return {
    summary,
    distribution: spec.distribution,
    betaNames,
    beta,
    gammaNames: Z.names,
    gamma: fit.par.slice(X.p, kc),
    covariance: covPublished,
    theta: fit.theta,
    rows: Int32Array.from(frame.rows),
    y: frame.y,
    mu: fit.mu,
    zeroProb: fit.zeroProb,
    expected: fit.expected,
    ...(sites ? { siteEffects: { levels: sites.levels, effect: sites.effect, sd: sites.sd, siteOfRow: sites.siteOfRow } } : {}),
    warnings,
  };
}
