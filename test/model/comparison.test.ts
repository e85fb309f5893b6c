/**
 * The written reading of the model comparison (src-shared/model/comparison.ts)
 * carries the numbers behind it, and those numbers are the reference ones:
 *   - MASS's quine data, Poisson (stats::glm) against negative binomial
 *     (MASS::glm.nb): AIC, Pearson chi-square / df and the boundary LR test
 *     from test/reference/glm/glm-fixtures.json (make-glm.R);
 *   - pscl's bioChemists data, Poisson against zero-inflated Poisson: the ZIP
 *     AIC from pscl::zeroinfl and the Poisson log-likelihood as the sum of the
 *     per-article terms pscl::vuong printed (test/reference/zero/zero-fits.json,
 *     make-zero.R); zeros seen counted from the CSV here.
 * The engine fits the models; the sentences are read back by pattern and the
 * numbers compared with the reference within what the 4 shown digits allow.
 */
import { describe, expect, it } from 'vitest';
import { fitModel } from '@shared/engine/fit';
import { compareModels, type ComparedModel } from '@shared/model/comparison';
import { parseModelSpec, type ModelSpec } from '@shared/model/spec';
import type { DataTable } from '@shared/data/table';
import { findColumn } from '@shared/data/table';
import { fixture, fixtureSpec, fixtureTable, glmFixtures } from '../engine/helpers/glm-fixtures';
import { bioChemists, reference, referenceFit } from '../engine/zero/reference-data';

function model(id: string, label: string, table: DataTable, spec: ModelSpec): ComparedModel {
  return { id, label, spec, outcome: fitModel(table, spec) };
}

/** The number after `before` in the sentence (4 significant digits as shown). */
function numberAfter(sentence: string, before: string): number {
  const at = sentence.indexOf(before);
  expect(at, `"${before}" in: ${sentence}`).toBeGreaterThanOrEqual(0);
  return Number(/^\s*(-?[\d.]+(?:e[-+]?\d+)?)/.exec(sentence.slice(at + before.length))![1]);
}

/** |shown - reference| within half a unit of the 4th significant digit (and 1e-4 relative for the fit). */
function shows(shown: number, ref: number): void {
  const digits = Math.abs(ref) >= 1000 ? 0.05 : 0.5 * 10 ** (Math.floor(Math.log10(Math.abs(ref))) - 3);
  expect(Math.abs(shown - ref)).toBeLessThanOrEqual(digits + 1e-4 * Math.abs(ref));
}

describe('the reading of quine: Poisson against negative binomial (MASS)', () => {
  const pois = fixture('quine-poisson');
  const nb = fixture('quine-negbin');
  const table = fixtureTable(pois);
  const models = [model('p', 'Poisson', table, fixtureSpec(pois)), model('nb', 'Negative binomial', table, fixtureSpec(nb))];
  const c = compareModels(models);
  const reading = c.reading;

  it('ranks by AIC with both AICs and their difference in the sentence', () => {
    const s = reading.find((r) => r.startsWith('By AIC'))!;
    expect(s).toMatch(/^By AIC, "Negative binomial" fits clearly better than the next, "Poisson"/);
    shows(numberAfter(s, '(AIC '), nb.expected.aic!);
    shows(numberAfter(s, ' against '), pois.expected.aic!);
    shows(numberAfter(s, 'a difference of '), pois.expected.aic! - nb.expected.aic!);
  });

  it("states the Poisson model's Pearson chi-square over its residual df", () => {
    const s = reading.find((r) => r.startsWith("The Poisson model's Pearson"))!;
    shows(numberAfter(s, 'Pearson χ² is '), pois.expected.pearsonChi2 / pois.expected.dfResidual);
  });

  it('gives the boundary likelihood-ratio test with its statistic and p', () => {
    const s = reading.find((r) => r.startsWith('Negative binomial against Poisson'))!;
    shows(numberAfter(s, 'LR statistic '), glmFixtures.lrNegbinPoisson.statistic);
    expect(glmFixtures.lrNegbinPoisson.p).toBeLessThan(0.001);
    expect(s).toContain('p < 0.001');
    expect(s).toContain('the extra variation is real');
    expect(c.overdispersion).toHaveLength(1);
    expect(c.overdispersion[0].first.id).toBe('p');
  });

  it('says the one fitted model has nothing to be compared with, and shows its AIC', () => {
    const one = compareModels([models[1]]).reading;
    expect(one[0]).toMatch(/^Only one model with a likelihood is fitted \("Negative binomial", AIC /);
    shows(numberAfter(one[0], 'AIC '), nb.expected.aic!);
  });

  it('never picks a model: the rows keep the order they were given', () => {
    expect(c.rows.map((r) => r.model.id)).toEqual(['p', 'nb']);
    expect(c.rows[1].deltaAic).toBe(0);
  });
});

describe('the reading of bioChemists: Poisson against zero-inflated Poisson (pscl)', () => {
  const table = bioChemists();
  const zipRef = referenceFit('zip');
  const zipSpec = parseModelSpec(zipRef.spec);
  const poissonSpec: ModelSpec = { ...zipSpec, distribution: 'poisson', zeroPredictors: [] };
  const c = compareModels([model('p', 'Poisson', table, poissonSpec), model('zip', 'ZIP', table, zipSpec)]);
  const vuongRef = reference.vuong.find((v) => v.id === 'poisson-vs-zip')!;
  const poissonLogLik = vuongRef.logLik1.reduce((a, b) => a + b, 0);
  const poissonAic = -2 * poissonLogLik + 2 * vuongRef.k1;
  const art = findColumn(table, 'art')!.values;
  const zeros = art.filter((v) => v === 0).length;

  it('ranks the ZIP first by AIC, both AICs in the sentence', () => {
    const s = c.reading.find((r) => r.startsWith('By AIC'))!;
    expect(s).toMatch(/^By AIC, "ZIP" fits clearly better than the next, "Poisson"/);
    shows(numberAfter(s, '(AIC '), zipRef.aic);
    shows(numberAfter(s, ' against '), poissonAic);
  });

  it('says the Poisson model expects too few zeros, with the zeros seen in the data', () => {
    const s = c.reading.find((r) => r.startsWith('"Poisson" expects'))!;
    expect(s).toContain(`zero counts where ${zeros} were seen: too few zeros; a negative binomial, zero-inflated or hurdle model may do better.`);
    expect(numberAfter(s, '"Poisson" expects ')).toBeLessThan(0.8 * zeros);
    // and beyond chance: more than 2 sqrt(expected) short (the SD of a count of zeros is at most sqrt(expected))
    expect(zeros - numberAfter(s, '"Poisson" expects ')).toBeGreaterThan(2 * Math.sqrt(numberAfter(s, '"Poisson" expects ')));
  });

  it('pairs the ZIP with the Poisson for a Vuong test that matches pscl (sign: positive favours the ZIP)', () => {
    expect(c.vuong).toHaveLength(1);
    const v = c.vuong[0];
    expect(v.first.id).toBe('zip');
    [v.result.raw, v.result.aicCorrected, v.result.bicCorrected].forEach((t, j) => expect(Math.abs(t.statistic + vuongRef.printedZ[j])).toBeLessThan(1e-5));
    expect(c.reading).toContain('Vuong tests are listed for information only; see the caution beside them.');
  });
});

describe('the reading of bioChemists: Poisson against negative binomial (pscl, MASS)', () => {
  // The log-likelihoods are sums of the per-article terms pscl::vuong printed for the Poisson (poisson-vs-zip)
  // and MASS::glm.nb (negbin-vs-zinb) fits; AIC counts theta as a parameter (common practice).
  const table = bioChemists();
  const zipSpec = parseModelSpec(referenceFit('zip').spec);
  const spec = (distribution: 'poisson' | 'negbin'): ModelSpec => ({ ...zipSpec, distribution, zeroPredictors: [] });
  const c = compareModels([model('nb', 'Negative binomial', table, spec('negbin')), model('p', 'Poisson', table, spec('poisson'))]);
  const logLik = (id: string) => reference.vuong.find((v) => v.id === id)!.logLik1.reduce((a, b) => a + b, 0);
  const k = reference.vuong.find((v) => v.id === 'negbin-vs-zinb')!.k1;
  const art = findColumn(table, 'art')!.values;
  const zeros = art.filter((v) => v === 0).length;

  it('ranks the negative binomial first, with the AICs of the reference fits', () => {
    const s = c.reading.find((r) => r.startsWith('By AIC'))!;
    expect(s).toMatch(/^By AIC, "Negative binomial" fits clearly better than the next, "Poisson"/);
    shows(numberAfter(s, '(AIC '), -2 * logLik('negbin-vs-zinb') + 2 * (k + 1));
    shows(numberAfter(s, ' against '), -2 * logLik('poisson-vs-zip') + 2 * k);
  });

  it('says no extra zero part is needed, with the zeros expected and seen and their shares', () => {
    const s = c.reading.find((r) => r.includes('extra zero part'))!;
    expect(s).toContain(`where ${zeros} (${((100 * zeros) / art.length).toFixed(1)}%) were seen: no sign that an extra zero part is needed.`);
    const expected = numberAfter(s, '"Negative binomial" expects ');
    expect(expected / zeros).toBeGreaterThanOrEqual(0.9);
    expect(expected / zeros).toBeLessThanOrEqual(1.1);
    expect(s).toContain(`zero counts (${((100 * c.rows[0].expectedZeros!) / art.length).toFixed(1)}%)`);
    // The Poisson is not so lucky: too few zeros.
    expect(c.reading.some((r) => r.startsWith('"Poisson" expects') && r.includes(`where ${zeros} were seen: too few zeros`))).toBe(true);
  });
});
