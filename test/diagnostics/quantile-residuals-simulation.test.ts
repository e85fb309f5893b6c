/**
 * Randomized quantile residuals are standard normal under the true model
 * (Dunn & Smyth 1996, the method's defining property): checked by a
 * Kolmogorov-Smirnov statistic against the 5% critical value 1.358 / sqrt(n)
 * (the large-sample 5% point of the Kolmogorov distribution, from memory;
 * 1.628 is its 1% point, also from memory) and by their first two
 * moments, for every distribution family, on seeded invented data.
 */
import { describe, expect, it } from 'vitest';
import { createRng } from '@shared/demo/prng';
import { fittedDistribution, quantileResiduals, simulateResponses } from '@shared/diagnostics';
import { fitModel } from '@shared/engine';
import { parseModelSpec } from '@shared/model/spec';
import { normalCdf } from './normal-cdf';
import { simulateSites, trueModel } from './simulated-sites';

const N = 1500;

function ksStatistic(r: Float64Array): number {
  const s = Float64Array.from(r).sort();
  let d = 0;
  s.forEach((v, i) => {
    const f = normalCdf(v);
    d = Math.max(d, (i + 1) / s.length - f, f - i / s.length);
  });
  return d;
}

function moments(r: Float64Array): { mean: number; variance: number } {
  const mean = r.reduce((a, v) => a + v, 0) / r.length;
  return { mean, variance: r.reduce((a, v) => a + (v - mean) ** 2, 0) / (r.length - 1) };
}

function parameters(seed: number) {
  const rng = createRng(seed);
  const mu = Float64Array.from({ length: N }, () => Math.exp(-0.5 + 2.5 * rng.uniform()));
  const zeroProb = Float64Array.from({ length: N }, () => 0.1 + 0.5 * rng.uniform());
  return { mu, zeroProb, rng };
}

describe('under the true model the residuals are N(0, 1)', () => {
  it.each([
    ['poisson', null],
    ['negbin', 1.5],
    ['zip', null],
    ['zinb', 0.8],
    ['hurdle-poisson', null],
    ['hurdle-negbin', 2],
  ] as const)('%s', (distribution, theta) => {
    const { mu, zeroProb, rng } = parameters(11);
    const withZero = distribution !== 'poisson' && distribution !== 'negbin';
    const model = trueModel(distribution, mu, new Float64Array(N), theta, withZero ? zeroProb : undefined);
    const y = simulateResponses(fittedDistribution(model), rng);
    // The simulated counts have the model's mean (loose: 4 standard errors of the mean).
    const mean = y.reduce((a, v) => a + v, 0) / N;
    const expected = model.expected.reduce((a, v) => a + v, 0) / N;
    expect(Math.abs(mean - expected)).toBeLessThan(0.12 * expected);
    const r = quantileResiduals({ ...model, y }, { seed: 5 }).residual;
    expect(ksStatistic(r)).toBeLessThan(1.358 / Math.sqrt(N));
    const m = moments(r);
    expect(Math.abs(m.mean)).toBeLessThan(4 / Math.sqrt(N));
    expect(Math.abs(m.variance - 1)).toBeLessThan(0.12);
  });
});

describe('after a fit', () => {
  const table = simulateSites(3, { sites: 40, seasons: 8, slope: -0.05, theta: 2, siteSd: 0.6, baseMean: 3 });
  const spec = (distribution: 'poisson' | 'negbin') =>
    parseModelSpec({ response: 'count', distribution, predictors: [{ column: 'season', type: 'numeric' }], offsets: [{ column: 'effort_h', log: true }], site: { column: 'site', effect: 'fixed' } });

  it('the right model (negative binomial) gives residuals close to N(0, 1)', () => {
    const r = quantileResiduals(fitModel(table, spec('negbin')), { seed: 2 }).residual;
    expect(ksStatistic(r)).toBeLessThan(1.63 / Math.sqrt(r.length)); // the 1% value: estimation makes it a little conservative
    expect(Math.abs(moments(r).variance - 1)).toBeLessThan(0.2);
  });

  it('the wrong model (Poisson for overdispersed counts) shows it: variance well above 1', () => {
    const r = quantileResiduals(fitModel(table, spec('poisson')), { seed: 2 }).residual;
    expect(moments(r).variance).toBeGreaterThan(1.5);
    expect(ksStatistic(r)).toBeGreaterThan(1.63 / Math.sqrt(r.length));
  });
});
