/**
 * Model-based outlier flags: for each record the probability, under its
 * fitted distribution, of a count at least as extreme as the one observed,
 * upper P(Y >= y) and, when asked, lower P(Y <= y). Records below the
 * analyst's threshold are flagged for a look; nothing is removed or changed.
 */
import { DiagnosticsInputError, fittedDistribution } from './fitted-distribution';
import type { FitForDiagnostics } from './fitted-distribution';
import { upperTail } from './tail-probability';

export interface OutlierFlag {
  /** Table row of the record. */
  readonly row: number;
  readonly y: number;
  readonly expected: number;
  /** The tail probability that fell below the threshold. */
  readonly probability: number;
  readonly tail: 'upper' | 'lower';
}

export interface OutlierOptions {
  /** Flag below this tail probability (0 < threshold < 0.5); default 0.001. */
  readonly threshold?: number;
  /** Also flag counts that are improbably low (default false: low counts are seldom errors in tallies). */
  readonly lowerTail?: boolean;
}

export interface OutlierFlags {
  readonly threshold: number;
  readonly lowerTail: boolean;
  /** Flags, most extreme first. */
  readonly flags: OutlierFlag[];
  /** How many flags a correct model would give by chance, at most (records x threshold per tail). */
  readonly expectedByChance: number;
  readonly note: string | null;
}

export function outlierFlags(fit: FitForDiagnostics, options: OutlierOptions = {}): OutlierFlags {
  const threshold = options.threshold ?? 0.001;
  if (!(threshold > 0 && threshold < 0.5)) {
    throw new DiagnosticsInputError('bad-threshold', `The outlier threshold is a probability between 0 and 0.5 (got ${threshold}); 0.001 is a usual choice.`);
  }
  const lowerTail = options.lowerTail ?? false;
  const dist = fittedDistribution(fit);
  const flags: OutlierFlag[] = [];
  for (let i = 0; i < dist.n; i++) {
    const y = fit.y[i];
    const upper = upperTail(dist, i, y);
    const lower = lowerTail ? dist.cdf(i, y) : 1;
    const base = { row: fit.rows[i], y, expected: fit.expected[i] };
    if (upper < threshold && upper <= lower) flags.push({ ...base, probability: upper, tail: 'upper' });
    else if (lower < threshold) flags.push({ ...base, probability: lower, tail: 'lower' });
  }
  flags.sort((a, b) => a.probability - b.probability);
  return { threshold, lowerTail, flags, expectedByChance: dist.n * threshold * (lowerTail ? 2 : 1), note: dist.note };
}
