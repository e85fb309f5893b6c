import { describe, expect, it } from 'vitest';
import { createRng, deriveSeed, intBetween, pickWeighted } from '@shared/demo/prng';
import { logFactorial, sampleGamma, sampleNegBinomial, sampleNormal, samplePoisson } from '@shared/demo/samplers';

/** Sample mean and variance (n - 1 divisor). */
function moments(xs: readonly number[]): { mean: number; variance: number } {
  const mean = xs.reduce((a, b) => a + b, 0) / xs.length;
  const variance = xs.reduce((a, b) => a + (b - mean) ** 2, 0) / (xs.length - 1);
  return { mean, variance };
}

function draw(n: number, seed: number, f: (rng: ReturnType<typeof createRng>) => number): number[] {
  const rng = createRng(seed);
  return Array.from({ length: n }, () => f(rng));
}

const N = 20000;

/** The sample mean lies within 5 standard errors of the true mean (common practice). */
function expectMean(xs: readonly number[], mean: number, variance: number): void {
  expect(Math.abs(moments(xs).mean - mean)).toBeLessThan(5 * Math.sqrt(variance / xs.length));
}

describe('seeded generator (mulberry32)', () => {
  it('repeats its sequence for a seed and differs between seeds', () => {
    const a = draw(50, 7, (r) => r.uniform());
    expect(draw(50, 7, (r) => r.uniform())).toEqual(a);
    expect(draw(50, 8, (r) => r.uniform())).not.toEqual(a);
  });

  it('gives uniforms strictly inside (0, 1) with mean 1/2 and variance 1/12 (common practice)', () => {
    const u = draw(N, 11, (r) => r.uniform());
    expect(Math.min(...u)).toBeGreaterThan(0);
    expect(Math.max(...u)).toBeLessThan(1);
    expectMean(u, 0.5, 1 / 12);
    expect(moments(u).variance).toBeCloseTo(1 / 12, 2);
  });

  it('derives different streams for different labels and seeds', () => {
    const seeds = new Set([deriveSeed(1, 'a'), deriveSeed(1, 'b'), deriveSeed(2, 'a'), deriveSeed(1, 'season-2012'), deriveSeed(1, 'season-2013')]);
    expect(seeds.size).toBe(5);
  });

  it('picks whole numbers in range and honours weights', () => {
    const ks = draw(N, 3, (r) => intBetween(r, 2, 4));
    expect(new Set(ks)).toEqual(new Set([2, 3, 4]));
    const w = draw(N, 4, (r) => pickWeighted(r, [{ value: 0, weight: 1 }, { value: 1, weight: 3 }]));
    // Bernoulli(0.75): mean 0.75, variance 0.1875 (common practice).
    expectMean(w, 0.75, 0.1875);
  });
});

describe('samplers against their distribution formulas (common practice)', () => {
  it('normal: mean and variance', () => {
    const x = draw(N, 21, (r) => sampleNormal(r, 2, 3));
    expectMean(x, 2, 9);
    expect(moments(x).variance / 9).toBeGreaterThan(0.95);
    expect(moments(x).variance / 9).toBeLessThan(1.05);
  });

  it.each([
    [0.6, 2],
    [3.5, 0.4],
  ])('gamma(shape %s, scale %s): mean k*s, variance k*s^2', (shape, scale) => {
    const x = draw(N, 31, (r) => sampleGamma(r, shape, scale));
    expect(Math.min(...x)).toBeGreaterThan(0);
    expectMean(x, shape * scale, shape * scale * scale);
    const ratio = moments(x).variance / (shape * scale * scale);
    expect(ratio).toBeGreaterThan(0.92);
    expect(ratio).toBeLessThan(1.08);
  });

  it.each([0.3, 3.2, 9.9, 10, 45, 400])('Poisson(%s): mean = variance = lambda, P(0) = exp(-lambda)', (lambda) => {
    const x = draw(N, 41, (r) => samplePoisson(r, lambda));
    expect(x.every((k) => Number.isInteger(k) && k >= 0)).toBe(true);
    expectMean(x, lambda, lambda);
    const ratio = moments(x).variance / lambda;
    expect(ratio).toBeGreaterThan(0.95);
    expect(ratio).toBeLessThan(1.05);
    const p0 = Math.exp(-lambda);
    const zeros = x.filter((k) => k === 0).length / N;
    expect(Math.abs(zeros - p0)).toBeLessThan(5 * Math.sqrt((p0 * (1 - p0)) / N) + 1e-9);
  });

  it.each([
    [4, 1.5],
    [0.8, 0.5],
    [30, 3],
  ])('negative binomial (mean %s, theta %s): variance mu + mu^2/theta, P(0) = (theta/(theta+mu))^theta', (mu, theta) => {
    const x = draw(N, 51, (r) => sampleNegBinomial(r, mu, theta));
    const variance = mu + (mu * mu) / theta;
    expectMean(x, mu, variance);
    const ratio = moments(x).variance / variance;
    expect(ratio).toBeGreaterThan(0.9);
    expect(ratio).toBeLessThan(1.1);
    const p0 = (theta / (theta + mu)) ** theta;
    const zeros = x.filter((k) => k === 0).length / N;
    expect(Math.abs(zeros - p0)).toBeLessThan(5 * Math.sqrt((p0 * (1 - p0)) / N));
  });

  it('log factorial agrees with the sum of logs (common practice)', () => {
    let sum = 0;
    for (let k = 1; k <= 300; k++) {
      sum += Math.log(k);
      expect(logFactorial(k)).toBeCloseTo(sum, 9);
    }
    expect(logFactorial(0)).toBe(0);
  });

  it('refuses impossible parameters with a plain message', () => {
    const rng = createRng(1);
    expect(() => samplePoisson(rng, -1)).toThrow(/mean >= 0/);
    expect(() => sampleGamma(rng, 0)).toThrow(/shape > 0/);
    expect(() => sampleNegBinomial(rng, 2, 0)).toThrow(/theta > 0/);
  });
});
