import { negbinVsPoissonTest, type LrTest } from '@shared/engine/inference/lrtest';
import { vuongForFits, type VuongResult } from '@shared/engine/zero/vuong';
import { zeroCounts } from '@shared/diagnostics';
import type { Distribution, ModelSpec } from '@shared/model/spec';
import type { FittedModel } from './fitted-model';
import { fmt, fmtP } from './format';

/**
 * The fitted models of one species side by side, the tests that apply
 * between them and a short reading that always shows its numbers. Nothing
 * here picks the model for the report: the analyst does.
 */
export interface ComparisonRow {
  readonly model: FittedModel;
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

export interface PairTest<T> {
  readonly first: FittedModel;
  readonly second: FittedModel;
  readonly result: T;
}

export interface Comparison {
  readonly rows: ComparisonRow[];
  readonly overdispersion: PairTest<LrTest>[];
  readonly vuong: PairTest<VuongResult>[];
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

function expectedZeros(m: FittedModel): number | null {
  try {
    return zeroCounts([{ label: m.label, fit: m.outcome }]).models[0].expected;
  } catch {
    return null;
  }
}

function pairs(models: readonly FittedModel[], match: (a: FittedModel, b: FittedModel) => boolean): [FittedModel, FittedModel][] {
  const out: [FittedModel, FittedModel][] = [];
  for (const a of models) for (const b of models) if (a !== b && match(a, b) && meanModelKey(a.spec) === meanModelKey(b.spec) && a.outcome.summary.nobs === b.outcome.summary.nobs) out.push([a, b]);
  return out;
}

export function compareModels(models: readonly FittedModel[]): Comparison {
  const aics = models.map((m) => m.outcome.summary.aic).filter((a): a is number => a !== null && Number.isFinite(a));
  const best = aics.length ? Math.min(...aics) : null;
  const rows = models.map((m): ComparisonRow => {
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
    if (r.expectedZeros !== null && r.observedZeros > 0 && r.expectedZeros < 0.8 * r.observedZeros) {
      const d = r.model.spec.distribution;
      const alternatives = d === 'poisson' || d === 'quasipoisson' ? 'a negative binomial, zero-inflated or hurdle model' : d === 'negbin' ? 'a zero-inflated or hurdle model' : 'another zero part (more zero-part predictors)';
      out.push(`"${r.model.label}" expects ${fmt(r.expectedZeros)} zero counts where ${r.observedZeros} were seen: too few zeros; ${alternatives} may do better.`);
    }
  }
  if (vu.length) out.push('Vuong tests are listed for information only; see the caution beside them.');
  return out;
}
