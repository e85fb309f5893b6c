import type { Distribution } from './spec';

/** One row of a coefficient table. Limits are Wald 95% on the linear-predictor scale. */
export interface CoefficientRow {
  term: string;
  estimate: number;
  se: number;
  z: number;
  p: number;
  lower: number;
  upper: number;
}

/** A warning from the engine: a stable code and a plain sentence. */
export interface EngineWarning {
  code:
    | 'aliased-column'
    | 'all-zero-level'
    | 'all-zero-site'
    | 'boundary-theta'
    | 'not-converged'
    | 'few-sites'
    | 'dropped-rows'
    | 'robust-se'
    | 'other';
  message: string;
}

/**
 * The published result of one fit: the shape the command line prints with
 * `fit --json` (shared/cli-contract.md). Numbers that do not apply are null.
 */
export interface FitSummary {
  converged: boolean;
  iterations: number;
  nobs: number;
  distribution: Distribution;
  logLikelihood: number | null;
  aic: number | null;
  bic: number | null;
  /** Number of estimated parameters (theta and random-effect sd included). */
  df: number;
  deviance: number | null;
  nullDeviance: number | null;
  dfResidual: number;
  pearsonChi2: number;
  dispersion?: number | null;
  theta: number | null;
  alpha: number | null;
  coefficients: CoefficientRow[];
  zeroCoefficients: CoefficientRow[];
  random: { column: string; sd: number } | null;
  /** 'model' or 'site-robust': which covariance the SEs come from. */
  seType?: 'model' | 'site-robust';
  warnings: string[];
}
