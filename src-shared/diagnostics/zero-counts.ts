/**
 * Observed against expected zeros per model: the number of records with a
 * zero count beside sum_i P(Y_i = 0), and both as a share of the records.
 * Too few expected zeros is the usual sign that a zero part is needed.
 */
import type { LabelledFit } from './count-frequencies';
import { requireSameRecords } from './count-frequencies';
import { fittedDistribution } from './fitted-distribution';

export interface ModelZeros {
  readonly label: string;
  readonly expected: number;
  readonly expectedShare: number;
  /** expected / observed (1 = the model gets the zeros right); null when no zero was observed. */
  readonly ratio: number | null;
}

export interface ZeroCounts {
  readonly nobs: number;
  readonly observed: number;
  readonly observedShare: number;
  /** Table rows of the zero counts. */
  readonly zeroRows: number[];
  readonly models: ModelZeros[];
}

export function zeroCounts(fits: readonly LabelledFit[]): ZeroCounts {
  requireSameRecords(fits);
  const { y, rows } = fits[0].fit;
  const zeroRows: number[] = [];
  for (let i = 0; i < y.length; i++) if (y[i] === 0) zeroRows.push(rows[i]);
  const n = y.length;
  const observed = zeroRows.length;
  const models = fits.map(({ label, fit }) => {
    const dist = fittedDistribution(fit);
    let expected = 0;
    for (let i = 0; i < dist.n; i++) expected += dist.mass(i, 0);
    return { label, expected, expectedShare: expected / n, ratio: observed > 0 ? expected / observed : null };
  });
  return { nobs: n, observed, observedShare: observed / n, zeroRows, models };
}
