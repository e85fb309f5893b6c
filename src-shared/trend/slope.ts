/** The log-linear slope of a fit with a linear time trend, as exp(b) - 1 per time unit with Wald limits. */
import type { FitOutcome } from '../engine/types';
import { contrast, coefficientIndex } from './contrast';
import { TrendError } from './errors';
import { changeFromLog, type ChangeInterval } from './interval';

export interface Slope extends ChangeInterval {
  /** The slope on the log scale and its SE. */
  readonly b: number;
  readonly se: number;
}

export function slopeOf(outcome: FitOutcome, column: string, z?: number): Slope {
  if (coefficientIndex(outcome, column) < 0) {
    throw new TrendError('missing-slope', `The fit has no slope on "${column}" (its terms are ${outcome.betaNames.join(', ')}). Give the time column numbers and "trend": "linear".`);
  }
  const e = contrast(outcome, [{ name: column, weight: 1 }]);
  return { b: e.estimate, se: e.se, ...changeFromLog(e.estimate, e.se, z) };
}
