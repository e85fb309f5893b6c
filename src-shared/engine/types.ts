import type { FitSummary } from '../model/fit-result';
import type { Distribution } from '../model/spec';

/**
 * Shared shapes inside the engine. Numbers live in Float64Array; matrices
 * are column-major (entry (i, j) of an n-row matrix is data[j * n + i]).
 */

/** A design matrix with named columns. */
export interface Design {
  /** Rows. */
  readonly n: number;
  /** Columns. */
  readonly p: number;
  /** Column-major n x p values. */
  readonly data: Float64Array;
  /** Column names as published: 'intercept', 'temp', 'habitat=sedge', 'a & b', 'year.s1' ... */
  readonly names: readonly string[];
  /** For each column, the spec term it came from (index into the term list; -1 for the intercept). */
  readonly termOf: readonly number[];
}

/** What a fit can be asked to do besides fitting. */
export interface FitControl {
  /** Called now and then with a fraction done (0..1) or a stage name. */
  onProgress?: (fraction: number, stage: string) => void;
  /** Checked between iterations; when aborted the fit throws a FitCancelled error. */
  signal?: { readonly aborted: boolean };
  maxIterations?: number;
  tolerance?: number;
  /**
   * 'none': estimates, log-likelihood and convergence only. No covariance
   * (`covariance`, SEs and site SDs are NaN), no null deviance, no robust
   * SEs; the convergence checks are the same. For refits that read only the
   * coefficients (the bootstrap). Default 'full'.
   */
  inference?: 'full' | 'none';
  /** Where to start the optimiser (e.g. a refit from the full-data fit); the optimum is the same. */
  start?: FitStart;
}

/**
 * Starting values by name: count-part and zero-part coefficients, theta,
 * and per-site effects (by the site level of the table being fitted). Used
 * by the zero-inflated and hurdle fits and by fixed site effects absorbed;
 * the other fits ignore it. When a value the fit needs is missing, the fit
 * starts as it would without a start.
 */
export interface FitStart {
  readonly beta: ReadonlyMap<string, number>;
  readonly gamma: ReadonlyMap<string, number>;
  readonly theta: number | null;
  readonly siteEffect: ReadonlyMap<string, number>;
}

/** Whether a fit is asked for its covariance and the rest of its inference. */
export function wantsInference(control: FitControl): boolean {
  return control.inference !== 'none';
}

/** A typed engine warning: a stable code and a plain sentence. */
export interface Warning {
  readonly code: string;
  readonly message: string;
}

export class FitCancelled extends Error {
  constructor() {
    super('The fit was cancelled.');
    this.name = 'FitCancelled';
  }
}

/** Bad data or spec for a fit: the message names the rows or columns and the fix. */
export class FitInputError extends Error {
  constructor(readonly code: string, message: string, readonly rows: readonly number[] = []) {
    super(message);
    this.name = 'FitInputError';
  }
}

/**
 * Everything a fit hands on: the published summary plus what predictions,
 * diagnostics, trends and reports need. Plain data (typed arrays, numbers,
 * strings) so that it crosses a worker boundary by structured clone.
 */
export interface FitOutcome {
  readonly summary: FitSummary;
  readonly distribution: Distribution;
  /** Names of the count-part coefficients, in the order of `beta` (as in summary.coefficients). */
  readonly betaNames: readonly string[];
  readonly beta: Float64Array;
  /** Names and values of the zero-part coefficients (empty without a zero part). */
  readonly gammaNames: readonly string[];
  readonly gamma: Float64Array;
  /**
   * Covariance of [beta, gamma] (k = beta.length + gamma.length), k x k
   * column-major; the one the SEs in the summary come from (robust when asked).
   */
  readonly covariance: Float64Array;
  /** Negative-binomial size, null for Poisson-type models. */
  readonly theta: number | null;
  /** Rows of the input table that were used, in order. */
  readonly rows: Int32Array;
  /** Per used row: the response. */
  readonly y: Float64Array;
  /** Per used row: the count-part mean (exp of the linear predictor incl. offsets and site effects). */
  readonly mu: Float64Array;
  /**
   * Per used row, for zero-inflated models the probability of an extra zero;
   * for hurdle models the probability of a non-zero count; absent otherwise.
   */
  readonly zeroProb?: Float64Array;
  /** Per used row: the expected response E[y] under the whole model. */
  readonly expected: Float64Array;
  /** Site effects when the spec has a site term: level names and their (conditional) effects and SDs. */
  readonly siteEffects?: { readonly levels: readonly string[]; readonly effect: Float64Array; readonly sd: Float64Array; readonly siteOfRow: Int32Array };
  /** Typed warnings (their sentences are also in summary.warnings). */
  readonly warnings: readonly Warning[];
}
