import { negbinVsPoissonTest, type LrTest } from '../engine/inference/lrtest';
import { vuongForFits, type VuongResult } from '../engine/zero/vuong';
import { zeroCounts } from '../diagnostics/zero-counts';
import type { FitOutcome } from '../engine/types';
import type { Distribution, ModelSpec } from './spec';
import { fmt, fmtP } from './number-text';

/**
 * The fitted models of one species side by side, the tests that apply
 * between them and a short reading that always shows its numbers. Nothing
 * here picks the model for the report: the analyst does.
 */
/** A fitted model as the comparison needs it (the Models stage's FittedModel is one). */
export interface ComparedModel {
  readonly id: string;
  readonly label: string;
  readonly spec: ModelSpec;
  readonly outcome: FitOutcome;
}

export interface ComparisonRow<M extends ComparedModel = ComparedModel> {
  readonly model: M;
  readonly logLik: number | null;
  readonly df: number;
  readonly aic: number | null;
  readonly deltaAic: number | null;
  readonly bic: number | null;
  /** Pearson chi-square over residual df. */
  readonly dispersion: number | null;
  readonly observedZeros: number;
  readonly expectedZeros: number | null;
}

export interface PairTest<T, M extends ComparedModel = ComparedModel> {
  readonly first: M;
  readonly second: M;
  readonly result: T;
}

export interface Comparison<M extends ComparedModel = ComparedModel> {
  readonly rows: ComparisonRow<M>[];
  readonly overdispersion: PairTest<LrTest, M>[];
  readonly vuong: PairTest<VuongResult, M>[];
  readonly reading: string[];
}

/** The spec without the parts a distribution change may alter: two models with the same mean model. */
function meanModelKey(spec: ModelSpec): string {
  const { distribution: _d, zeroPredictors: _z, ...rest } = spec;
  void _d;
  void _z;
  return JSON.stringify(rest);
}

const zeroPartOf: Partial<Record<Distribution, Distribution>> = { zip: 'poisson', zinb: 'negbin', 'hurdle-poisson': 'poisson', 'hurdle-negbin': 'negbin' };

function expectedZeros(m: ComparedModel): number | null {
  try {
    return zeroCounts([{ label: m.label, fit: m.outcome }]).models[0].expected;
  } catch {
    return null;
  }
}

function pairs<M extends ComparedModel>(models: readonly M[], match: (a: M, b: M) => boolean): [M, M][] {
  const out: [M, M][] = [];
  for (const a of models) for (const b of models) if (a !== b && match(a, b) && meanModelKey(a.spec) === meanModelKey(b.spec) && a.outcome.summary.nobs === b.outcome.summary.nobs) out.push([a, b]);
  return out;
}

export function compareModels<M extends ComparedModel>(models: readonly M[]): Comparison<M> {
  const aics = models.map((m) => m.outcome.summary.aic).filter((a): a is number => a !== null && Number.isFinite(a));
  const best = aics.length ? Math.min(...aics) : null;
  const rows = models.map((m): ComparisonRow<M> => {
    const s = m.outcome.summary;
    const y = m.outcome.y;
    let zeros = 0;
    for (let i = 0; i < y.length; i++) if (y[i] === 0) zeros++;
    return {
      model: m,
      logLik: s.logLikelihood,
      df: s.df,
      aic: s.aic,
      deltaAic: s.aic !== null && best !== null ? s.aic - best : null,
      bic: s.bic,
      dispersion: s.dfResidual > 0 ? s.pearsonChi2 / s.dfResidual : null,
      observedZeros: zeros,
      expectedZeros: expectedZeros(m),
    };
  });
  const overdispersion = pairs(models, (p, n) => p.spec.distribution === 'poisson' && n.spec.distribution === 'negbin').map(([p, n]) => ({ first: p, second: n, result: negbinVsPoissonTest(p.outcome.summary, n.outcome.summary) }));
  const vuong = pairs(models, (z, c) => zeroPartOf[z.spec.distribution] === c.spec.distribution).flatMap(([z, c]) => {
    try {
      return [{ first: z, second: c, result: vuongForFits(z.outcome, c.outcome) }];
    } catch {
      return [];
    }
  });
  return { rows, overdispersion, vuong, reading: readingOf(rows, overdispersion, vuong) };
}

const percent = (part: number, n: number) => `${((100 * part) / n).toFixed(1)}%`;

function readingOf(rows: readonly ComparisonRow[], od: readonly PairTest<LrTest>[], vu: readonly PairTest<VuongResult>[]): string[] {
  const out: string[] = [];
  const ranked = rows.filter((r) => r.aic !== null).sort((a, b) => (a.aic as number) - (b.aic as number));
  if (ranked.length >= 2) {
    const [first, second] = ranked;
    const gap = (second.aic as number) - (first.aic as number);
    const strength = gap > 10 ? 'clearly' : gap > 2 ? 'somewhat' : 'hardly';
    out.push(`By AIC, "${first.model.label}" fits ${strength} better than the next, "${second.model.label}" (AIC ${fmt(first.aic)} against ${fmt(second.aic)}, a difference of ${fmt(gap)}; below about 2 the two are about as good).`);
  } else if (ranked.length === 1) {
    out.push(`Only one model with a likelihood is fitted ("${ranked[0].model.label}", AIC ${fmt(ranked[0].aic)}); fit another to compare.`);
  }
  for (const r of rows) {
    if (r.model.spec.distribution === 'poisson' && r.dispersion !== null && r.dispersion > 1.5) {
      out.push(`The Poisson model's Pearson χ² is ${fmt(r.dispersion)} times its residual df (1 expected): the counts vary more than a Poisson allows, so its standard errors are too small.`);
    }
  }
  for (const t of od) {
    out.push(`Negative binomial against Poisson: LR statistic ${fmt(t.result.statistic)}, p ${fmtP(t.result.p, true)} (half the χ²(1) tail, as θ = ∞ lies on the boundary)${t.result.p < 0.05 ? ': the extra variation is real.' : ': no clear sign of extra variation.'}`);
  }
  for (const r of rows) {
    // A shortfall counts only when it is beyond chance too: the number of zeros is a sum of
    // Bernoulli variables, so its SD is at most sqrt(expected) (common practice: about 2 SD).
    if (r.expectedZeros !== null && r.observedZeros > 0 && r.expectedZeros < 0.8 * r.observedZeros && r.observedZeros - r.expectedZeros > 2 * Math.sqrt(r.expectedZeros)) {
      const d = r.model.spec.distribution;
      const alternatives = d === 'poisson' || d === 'quasipoisson' ? 'a negative binomial, zero-inflated or hurdle model' : d === 'negbin' ? 'a zero-inflated or hurdle model' : 'another zero part (more zero-part predictors)';
      out.push(`"${r.model.label}" expects ${fmt(r.expectedZeros)} zero counts where ${r.observedZeros} were seen: too few zeros; ${alternatives} may do better.`);
    }
  }
  const best = ranked[0];
  if (best && best.expectedZeros !== null && best.observedZeros > 0 && !zeroPartOf[best.model.spec.distribution]) {
    const ratio = best.expectedZeros / best.observedZeros;
    const n = best.model.outcome.y.length;
    if (ratio >= 0.9 && ratio <= 1.1) {
      out.push(`"${best.model.label}" expects ${fmt(best.expectedZeros)} zero counts (${percent(best.expectedZeros, n)}) where ${best.observedZeros} (${percent(best.observedZeros, n)}) were seen: no sign that an extra zero part is needed.`);
    }
  }
  if (vu.length) out.push('Vuong tests are listed for information only; see the caution beside them.');
  return out;
}
