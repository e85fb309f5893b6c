/**
 * The published summary (the `fit --json` object) of a model with site
 * effects: information criteria counting every estimated parameter and
 * warnings as sentences. Wald rows, deviance and Pearson statistic come from
 * ../inference.
 */
import type { Distribution } from '../../model/spec';
import type { CoefficientRow, FitSummary } from '../../model/fit-result';
import type { Family } from '../families/types';
import { negbinFamily } from '../families/negbin';
import { poissonFamily } from '../families/poisson';
import type { Warning } from '../types';

/** The count family of a site model: Poisson when theta is null, else NB2 with that theta. */
export function countFamily(theta: number | null): Family {
  return theta === null ? poissonFamily : negbinFamily(theta);
}

export interface SiteSummaryInput {
  distribution: Distribution;
  converged: boolean;
  iterations: number;
  nobs: number;
  /** Full log-likelihood, or null (quasi). */
  logLik: number | null;
  /** Estimated parameters in all. */
  df: number;
  deviance: number | null;
  nullDeviance: number | null;
  dfResidual: number;
  pearsonChi2: number;
  dispersion?: number | null;
  theta: number | null;
  coefficients: CoefficientRow[];
  random: { column: string; sd: number } | null;
  warnings: readonly Warning[];
}

export function siteSummary(s: SiteSummaryInput): FitSummary {
  const ll = s.logLik;
  const out: FitSummary = {
    converged: s.converged,
    iterations: s.iterations,
    nobs: s.nobs,
    distribution: s.distribution,
    logLikelihood: ll,
    aic: ll === null ? null : -2 * ll + 2 * s.df,
    bic: ll === null ? null : -2 * ll + Math.log(s.nobs) * s.df,
    df: s.df,
    deviance: s.deviance,
    nullDeviance: s.nullDeviance,
    dfResidual: s.dfResidual,
    pearsonChi2: s.pearsonChi2,
    theta: s.theta,
    alpha: s.theta === null ? null : 1 / s.theta,
    coefficients: s.coefficients,
    zeroCoefficients: [],
    random: s.random,
    seType: 'model',
    warnings: s.warnings.map((w) => w.message),
  };
  if (s.dispersion !== undefined) out.dispersion = s.dispersion;
  return out;
}
