import type { CovariateValue } from './visit-covariates';

/**
 * How a visit covariate becomes one value of an analysis row, which is made
 * from several visits (a site x season x species row sums its visits' counts):
 *   numbers - the mean over the row's visits that have a value (blank visits
 *             are not counted as 0); blank when none of them has one;
 *   text    - kept when every visit of the row that has a value gives the
 *             same text; when they differ the row is left blank (and counted,
 *             so the builder can say how many rows that is).
 * A covariate is numbers when every value the records hold is a number
 * (the import reads "12,5" with the sheet's decimal mark), else text.
 */
export type CovariateKind = 'number' | 'text';

/** One visit covariate's column in the analysis table. */
export interface VisitCovariateColumn {
  /** The covariate's name: its header on the counts sheet. */
  readonly name: string;
  /** Its column in the analysis table. */
  readonly column: string;
  readonly kind: CovariateKind;
  /** Rows left blank because their visits gave different texts (text covariates only). */
  readonly disagreeing: number;
}

export function covariateKind(values: Iterable<CovariateValue>): CovariateKind {
  for (const v of values) if (v !== null && typeof v !== 'number') return 'text';
  return 'number';
}

export interface CombinedValue {
  readonly value: number | string | null;
  /** The visits gave different texts, so the row is left blank. */
  readonly disagree: boolean;
}

export function combineVisits(values: readonly CovariateValue[], kind: CovariateKind): CombinedValue {
  if (kind === 'number') {
    let sum = 0;
    let n = 0;
    for (const v of values) {
      if (typeof v === 'number' && Number.isFinite(v)) {
        sum += v;
        n++;
      }
    }
    return { value: n ? sum / n : null, disagree: false };
  }
  const texts = new Set<string>();
  for (const v of values) if (v !== null && String(v).trim() !== '') texts.add(String(v).trim());
  if (texts.size > 1) return { value: null, disagree: true };
  return { value: texts.size ? [...texts][0] : null, disagree: false };
}
