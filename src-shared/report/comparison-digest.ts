/**
 * The model comparison of one group as the report prints it: one row per
 * candidate model, the tests that apply between them, a short reading that
 * always shows its numbers, and which model the analyst chose. A plain input
 * with no fits inside, so any stage (the app, the command line, a saved
 * project) can hand it to the report. `digestOfComparison` makes one from
 * the Models stage's comparison (src-shared/model/comparison.ts), and
 * `comparisonDigest` from fitted models.
 */
import { compareModels, type ComparedModel, type Comparison, type ComparisonRow } from '../model/comparison';
import type { FitOutcome } from '../engine/types';
import type { Distribution, ModelSpec } from '../model/spec';
import { formatNumber } from './number-format';

/**
 * One model's row: the Models stage's comparison row (log-likelihood, df =
 * parameters as AIC counts them, AIC, delta AIC, BIC, Pearson dispersion,
 * observed and expected zeros) without the fit, plus its label.
 */
export type ComparisonDigestRow = Omit<ComparisonRow, 'model'> & {
  /** The model's name as the analyst knows it ("Negative binomial"). */
  readonly label: string;
  readonly distribution: Distribution;
  readonly converged: boolean;
};

export interface ComparisonTestLine {
  readonly test: 'likelihood ratio' | 'Vuong';
  /** The two models, as labelled in the rows. */
  readonly models: readonly [string, string];
  readonly statistic: number;
  readonly p: number;
  /** The line as printed, with what the test can and cannot say. */
  readonly text: string;
}

export interface ModelComparisonDigest {
  readonly rows: readonly ComparisonDigestRow[];
  readonly tests: readonly ComparisonTestLine[];
  /** Sentences that read the table, each with its numbers. */
  readonly reading: readonly string[];
  /** Label of the model the report's trend comes from (one of the rows). */
  readonly chosen: string;
  /** The analyst's own words on why, when given. */
  readonly reason?: string;
}

/** A fitted candidate: its label, its spec and the engine's outcome. */
export interface CandidateFit {
  readonly label: string;
  readonly spec: ModelSpec;
  readonly outcome: FitOutcome;
}

const two = { kind: 'fixed', decimals: 2 } as const;
const pText = (p: number) => formatNumber(p, { kind: 'p' });

/** The test lines of a comparison, each with what the test can and cannot say. */
function testLines(c: Comparison): ComparisonTestLine[] {
  const lr = c.overdispersion.map(({ first, second, result: t }): ComparisonTestLine => ({
    test: 'likelihood ratio',
    models: [first.label, second.label],
    statistic: t.statistic,
    p: t.p,
    text: `Likelihood ratio, "${second.label}" against "${first.label}": statistic ${formatNumber(t.statistic, two)}, p ${pText(t.p)} (half the chi-square(1) tail, as theta = infinity lies on the boundary): ${t.p < 0.05 ? 'the counts vary more than a Poisson allows' : 'no clear sign of extra variation'}.`,
  }));
  const vuong = c.vuong.map(({ first, second, result }): ComparisonTestLine => {
    const v = result.aicCorrected;
    return {
      test: 'Vuong',
      models: [first.label, second.label],
      statistic: v.statistic,
      p: v.p,
      text: `Vuong (AIC-corrected), "${first.label}" against "${second.label}": z ${formatNumber(v.statistic, two)}, one-sided p ${pText(v.p)}, leaning to "${v.favours === 'first' ? first.label : second.label}". For information only: the zero model contains the count model, so this is not a valid test for extra zeros (Wilson 2015).`,
    };
  });
  return [...lr, ...vuong];
}

/** The digest of a comparison; `chosen` is the label of the model the analyst chose for the report. */
export function digestOfComparison(c: Comparison, chosen: string, reason?: string): ModelComparisonDigest {
  const labels = c.rows.map((r) => r.model.label);
  const twice = labels.find((l, i) => labels.indexOf(l) !== i);
  if (twice !== undefined) throw new RangeError(`Two of the models compared are both labelled "${twice}"; give each model its own label so the report can say which one was chosen.`);
  if (!c.rows.some((r) => r.model.label === chosen)) {
    throw new RangeError(`The chosen model "${chosen}" is not among the models compared (${c.rows.map((r) => `"${r.model.label}"`).join(', ')}); choose one of them.`);
  }
  const rows = c.rows.map(({ model, ...numbers }): ComparisonDigestRow => ({ ...numbers, label: model.label, distribution: model.spec.distribution, converged: model.outcome.summary.converged }));
  return { rows, tests: testLines(c), reading: [...c.reading], chosen, ...(reason ? { reason } : {}) };
}

/** The digest of fitted candidates (compared as the Models stage compares them). */
export function comparisonDigest(candidates: readonly CandidateFit[], chosen: string, reason?: string): ModelComparisonDigest {
  const models: ComparedModel[] = candidates.map((c, i) => ({ id: `m${i + 1}`, ...c }));
  return digestOfComparison(compareModels(models), chosen, reason);
}
