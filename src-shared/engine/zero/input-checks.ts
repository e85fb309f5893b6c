/** Checks of the response that a zero-inflated or hurdle model needs, with plain messages. */
import { FitInputError } from '../types';
import type { ZeroKind } from './observation-terms';

export interface CheckedKind {
  readonly zero: ZeroKind;
  /** Plain words for messages, e.g. "zero-inflated Poisson". */
  readonly label: string;
}

/**
 * Refuses responses whose zero part or count part has nothing to estimate:
 * every count zero, no zero at all, or (hurdle) every non-zero count 1.
 */
export function checkCounts(y: Float64Array, kind: CheckedKind, response: string): void {
  let zeros = 0;
  let aboveOne = 0;
  for (let i = 0; i < y.length; i++) {
    if (y[i] === 0) zeros++;
    else if (y[i] > 1) aboveOne++;
  }
  if (zeros === y.length) {
    throw new FitInputError('all-zero-response', `Every count in "${response}" is zero in the rows used, so there is no count part to estimate. Check the response column and the row selection.`);
  }
  if (zeros === 0) {
    throw new FitInputError(
      'no-zero-counts',
      `The response "${response}" has no zero counts in the rows used, so the zero part of a ${kind.label} model cannot be estimated. Use "poisson" or "negbin" instead.`,
    );
  }
  if (kind.zero === 'hurdle' && aboveOne === 0) {
    throw new FitInputError(
      'no-count-part',
      `Every non-zero count in "${response}" is 1, so the zero-truncated count part of a ${kind.label} model has nothing to estimate. The data are presence/absence: use a zero-inflated model, or model presence alone.`,
    );
  }
}
