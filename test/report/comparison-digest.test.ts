/**
 * The report's model comparison against R: test/reference/report/make-comparison.R
 * (R 4.2.2, MASS 7.3.58.2, pscl 1.5.5) on pscl's bioChemists, fixture
 * comparison-fixtures.json beside it.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { describe, expect, it } from 'vitest';
import { fitModel } from '@shared/engine/fit';
import { parseModelSpec, type Distribution } from '@shared/model/spec';
import { comparisonDigest, type CandidateFit } from '@shared/report/comparison-digest';
import { comparisonBlocks } from '@shared/report/comparison-section';
import { bioChemists } from '../engine/zero/reference-data';

interface RefRow { id: Distribution; logLik: number; df: number; aic: number; bic: number; pearsonChi2: number; dfResidual: number; expectedZeros: number }
const ref = JSON.parse(readFileSync(resolve(__dirname, '../reference/report/comparison-fixtures.json'), 'utf8')) as {
  observedZeros: number;
  models: RefRow[];
  lrNegbinPoisson: { statistic: number; p: number };
  vuong: { first: string; second: string; statistic: number; p: number }[];
};

const terms = [
  { column: 'fem', type: 'factor', reference: 'Men' },
  { column: 'mar', type: 'factor', reference: 'Single' },
  { column: 'kid5', type: 'numeric' },
  { column: 'phd', type: 'numeric' },
  { column: 'ment', type: 'numeric' },
] as const;

const LABELS: Record<string, string> = { poisson: 'Poisson', negbin: 'Negative binomial', zip: 'Zero-inflated Poisson', zinb: 'Zero-inflated NB' };

function candidates(): CandidateFit[] {
  const table = bioChemists();
  return ref.models.map((m) => {
    const zero = m.id === 'zip' || m.id === 'zinb';
    const spec = parseModelSpec({ response: 'art', distribution: m.id, predictors: terms, zeroPredictors: zero ? terms : [], offsets: [] });
    return { label: LABELS[m.id], spec, outcome: fitModel(table, spec) };
  });
}

const digest = comparisonDigest(candidates(), 'Zero-inflated NB', 'lowest AIC and the zeros right.');

describe('model comparison digest (R: glm, glm.nb, pscl::zeroinfl on bioChemists)', () => {
  it('holds each model’s log-likelihood, parameters, AIC, BIC and delta AIC as R has them', () => {
    const best = Math.min(...ref.models.map((m) => m.aic));
    ref.models.forEach((m, i) => {
      const r = digest.rows[i];
      expect(r.label).toBe(LABELS[m.id]);
      expect(r.df).toBe(m.df);
      expect(r.logLik!).toBeCloseTo(m.logLik, 4);
      expect(r.aic!).toBeCloseTo(m.aic, 3);
      expect(r.bic!).toBeCloseTo(m.bic, 3);
      expect(r.deltaAic!).toBeCloseTo(m.aic - best, 3);
    });
  });

  it('holds the observed and expected zeros (sum of P(Y = 0)) and the Pearson dispersion', () => {
    ref.models.forEach((m, i) => {
      const r = digest.rows[i];
      expect(r.observedZeros).toBe(ref.observedZeros);
      expect(r.expectedZeros!).toBeCloseTo(m.expectedZeros, 2);
      expect(r.dispersion!).toBeCloseTo(m.pearsonChi2 / m.dfResidual, 3);
    });
  });

  it('lists the boundary LR test of NB against Poisson and the AIC-corrected Vuong tests with R’s numbers', () => {
    const lr = digest.tests.find((t) => t.test === 'likelihood ratio')!;
    expect(lr.models).toEqual(['Poisson', 'Negative binomial']);
    expect(lr.statistic).toBeCloseTo(ref.lrNegbinPoisson.statistic, 3);
    expect(lr.p / ref.lrNegbinPoisson.p).toBeCloseTo(1, 3);
    for (const v of ref.vuong) {
      const t = digest.tests.find((x) => x.test === 'Vuong' && x.models[0] === LABELS[v.first] && x.models[1] === LABELS[v.second])!;
      expect(t.statistic).toBeCloseTo(v.statistic, 3);
      expect(t.p).toBeCloseTo(v.p, 4);
      expect(t.text).toMatch(/not a valid test for extra zeros/);
    }
    expect(digest.tests).toHaveLength(3);
  });

  it('reads the table with its numbers and says the analyst chose the model', () => {
    // The reading is the Models stage's (src-shared/model/comparison.ts); R's AIC and expected zeros appear in it as shown.
    expect(digest.reading[0]).toMatch(/^By AIC, "Zero-inflated NB" fits [a-z]+ better than the next, "Negative binomial"/);
    expect(digest.reading.some((s) => s.includes("Poisson model's Pearson"))).toBe(true);
    expect(digest.reading.some((s) => s.startsWith('"Poisson" expects 191.4 zero counts where 275 were seen'))).toBe(true);
    const blocks = comparisonBlocks('x', 'articles', digest);
    const lead = blocks[0];
    expect(lead.kind === 'paragraph' && lead.text).toMatch(/"Zero-inflated NB", chosen by the analyst from the 4 models below\. It has the lowest AIC/);
    const table = blocks[1];
    expect(table.kind === 'table' && table.rows.map((r) => r[r.length - 1])).toEqual(['', '', '', 'yes']);
  });

  it('refuses a chosen model that is not among the candidates, naming them', () => {
    const [a, b] = candidates();
    expect(() => comparisonDigest([a, { ...b, label: a.label }], a.label)).toThrow(/both labelled "Poisson"/);
    expect(() => comparisonDigest(candidates().slice(0, 2), 'ZINB')).toThrow(/"ZINB" is not among the models compared \("Poisson", "Negative binomial"\)/);
  });
});
