import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { createRng, type Rng } from '@shared/demo/prng';
import { sampleGamma, sampleNegBinomial, sampleNormal, samplePoisson } from '@shared/demo/samplers';

/**
 * Sampled frequencies against exact probabilities from R (base package stats:
 * dpois, dnbinom, qgamma, qnorm), stored in reference/count-probabilities.json
 * by reference/make-count-probabilities.R. Each case passes a chi-square
 * goodness-of-fit test at p = 0.001 (common practice).
 */
interface CountCase { distribution: 'poisson' | 'negbin'; mean: number; theta?: number; firstK: number; probabilities: number[] }
interface QuantileCase { distribution: 'gamma' | 'normal'; shape?: number; scale?: number; mean?: number; sd?: number; deciles: number[] }
const REF = JSON.parse(readFileSync(join(__dirname, 'reference/count-probabilities.json'), 'utf8')) as { source: string; counts: CountCase[]; quantiles: QuantileCase[] };
const N = 20000;

/** Upper 0.1 % point of chi-square with df degrees of freedom, Wilson-Hilferty approximation (common practice). */
function chiSquare999(df: number): number {
  const h = 2 / (9 * df);
  return df * (1 - h + 3.0902 * Math.sqrt(h)) ** 3;
}

/** Pearson chi-square of observed bin counts against expected probabilities (bins merged until each expects >= 5). */
function chiSquare(observed: number[], probabilities: number[]): { stat: number; df: number } {
  const bins: { o: number; e: number }[] = [];
  let o = 0;
  let e = 0;
  observed.forEach((count, i) => {
    o += count;
    e += probabilities[i] * N;
    if (e >= 5) {
      bins.push({ o, e });
      o = 0;
      e = 0;
    }
  });
  if (bins.length === 0) throw new Error('no bin expects 5 or more');
  bins[bins.length - 1].o += o;
  bins[bins.length - 1].e += e;
  return { stat: bins.reduce((s, b) => s + (b.o - b.e) ** 2 / b.e, 0), df: bins.length - 1 };
}

function sample(seed: number, f: (rng: Rng) => number): number[] {
  const rng = createRng(seed);
  return Array.from({ length: N }, () => f(rng));
}

describe(`samplers against R probabilities (${REF.source})`, () => {
  it.each(REF.counts.map((c) => [c.distribution, c.mean, c.theta ?? null, c] as const))('%s mean %s theta %s', (_d, _m, _t, c) => {
    const draws = sample(97, (rng) => (c.distribution === 'poisson' ? samplePoisson(rng, c.mean) : sampleNegBinomial(rng, c.mean, c.theta!)));
    // The last bin takes the upper tail, so its probability is 1 - the rest.
    const probs = [...c.probabilities];
    probs[probs.length - 1] = 1 - probs.slice(0, -1).reduce((a, b) => a + b, 0);
    const observed = probs.map(() => 0);
    for (const k of draws) observed[Math.min(k - c.firstK, probs.length - 1)]++;
    const { stat, df } = chiSquare(observed, probs);
    expect(df).toBeGreaterThanOrEqual(2);
    expect(stat).toBeLessThan(chiSquare999(df));
  });

  it.each(REF.quantiles.map((q) => [q.distribution, q] as const))('%s: a tenth of the draws between successive deciles', (_d, q) => {
    const draws = sample(98, (rng) => (q.distribution === 'gamma' ? sampleGamma(rng, q.shape!, q.scale!) : sampleNormal(rng, q.mean!, q.sd!)));
    const observed = Array.from({ length: q.deciles.length + 1 }, () => 0);
    for (const x of draws) {
      let bin = 0;
      while (bin < q.deciles.length && x > q.deciles[bin]) bin++;
      observed[bin]++;
    }
    const { stat, df } = chiSquare(observed, observed.map(() => 0.1));
    expect(df).toBe(9);
    expect(stat).toBeLessThan(chiSquare999(df));
  });

  it('the goodness-of-fit check can fail: Poisson draws do not pass as negative binomial', () => {
    const c = REF.counts.find((k) => k.distribution === 'negbin' && k.mean === 4)!;
    const draws = sample(99, (rng) => samplePoisson(rng, c.mean));
    const probs = [...c.probabilities];
    probs[probs.length - 1] = 1 - probs.slice(0, -1).reduce((a, b) => a + b, 0);
    const observed = probs.map(() => 0);
    for (const k of draws) observed[Math.min(k, probs.length - 1)]++;
    const { stat, df } = chiSquare(observed, probs);
    expect(stat).toBeGreaterThan(chiSquare999(df));
  });
});
