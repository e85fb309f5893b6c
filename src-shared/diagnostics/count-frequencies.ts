/**
 * Observed and expected count frequencies: for k = 0 .. K - 1 and a last
 * bin "K or more", the number of records with that count beside
 * sum_i P(Y_i = k) (last bin: sum_i P(Y_i >= K)) under each fitted model.
 * The frequencies behind the frequency plot, the rootogram and the zeros.
 */
import type { FitForDiagnostics } from './fitted-distribution';
import { DiagnosticsInputError, fittedDistribution } from './fitted-distribution';

export interface LabelledFit {
  /** The model's name as the analyst knows it ("Negative binomial, site fixed"). */
  readonly label: string;
  readonly fit: FitForDiagnostics;
}

export interface ModelFrequencies {
  readonly label: string;
  /** Expected number of records per bin (same bins as `observed`). */
  readonly expected: number[];
  readonly note: string | null;
}

export interface CountFrequencies {
  /** K: bins are 0 .. K - 1 and "K or more". */
  readonly tailFrom: number;
  /** Bin labels: "0", "1", ..., "K or more". */
  readonly labels: string[];
  /** Observed number of records per bin. */
  readonly observed: number[];
  /** Table rows in each bin, so a bar can be linked to its records. */
  readonly rowsByBin: number[][];
  readonly models: ModelFrequencies[];
  readonly nobs: number;
}

export interface FrequencyOptions {
  /** K, the first count of the tail bin; default chosen from the data (see chooseTailFrom). */
  readonly tailFrom?: number;
}

/**
 * K from the data: the largest count when it is 30 or less (every count has
 * its own bar), otherwise the 95th percentile of the counts, but at least 30
 * and at most 60, so the chart stays readable.
 */
export function chooseTailFrom(y: ArrayLike<number>): number {
  let max = 0;
  for (let i = 0; i < y.length; i++) if (y[i] > max) max = y[i];
  if (max <= 30) return Math.max(1, max);
  const sorted = Float64Array.from(y).sort();
  const q95 = sorted[Math.min(sorted.length - 1, Math.ceil(0.95 * sorted.length) - 1)];
  return Math.min(60, Math.max(30, q95));
}

/** Checks that every fit describes the same records (same rows and responses). */
export function requireSameRecords(fits: readonly LabelledFit[]): void {
  if (fits.length === 0) throw new DiagnosticsInputError('no-models', 'Give at least one fitted model to compare with the observed counts.');
  const first = fits[0];
  for (const other of fits.slice(1)) {
    const a = first.fit.rows;
    const b = other.fit.rows;
    const same = a.length === b.length && a.every((r, i) => r === b[i] && first.fit.y[i] === other.fit.y[i]);
    if (!same) {
      throw new DiagnosticsInputError(
        'different-records',
        `The models "${first.label}" and "${other.label}" were fitted to different records (${a.length} and ${b.length} rows used), so their expected frequencies cannot be compared. Fit them to the same rows, e.g. with the same columns filled in.`,
      );
    }
  }
}

/** Expected records per bin for one fit: the first K masses and the upper tail. */
function expectedBins(fit: FitForDiagnostics, tailFrom: number): { expected: number[]; note: string | null } {
  const dist = fittedDistribution(fit);
  const expected = new Array<number>(tailFrom + 1).fill(0);
  for (let i = 0; i < dist.n; i++) {
    for (let k = 0; k < tailFrom; k++) expected[k] += dist.mass(i, k);
    expected[tailFrom] += Math.max(0, 1 - dist.cdf(i, tailFrom - 1));
  }
  return { expected, note: dist.note };
}

export function countFrequencies(fits: readonly LabelledFit[], options: FrequencyOptions = {}): CountFrequencies {
  requireSameRecords(fits);
  const { y, rows } = fits[0].fit;
  const tailFrom = options.tailFrom ?? chooseTailFrom(y);
  if (!(Number.isInteger(tailFrom) && tailFrom >= 1)) {
    throw new DiagnosticsInputError('bad-tail', `The first count of the last bin must be a whole number of 1 or more (got ${tailFrom}).`);
  }
  const observed = new Array<number>(tailFrom + 1).fill(0);
  const rowsByBin: number[][] = Array.from({ length: tailFrom + 1 }, () => []);
  for (let i = 0; i < y.length; i++) {
    const bin = Math.min(y[i], tailFrom);
    observed[bin]++;
    rowsByBin[bin].push(rows[i]);
  }
  const labels = Array.from({ length: tailFrom + 1 }, (_, k) => (k === tailFrom ? `${k} or more` : String(k)));
  const models = fits.map((f) => ({ label: f.label, ...expectedBins(f.fit, tailFrom) }));
  return { tailFrom, labels, observed, rowsByBin, models, nobs: y.length };
}
