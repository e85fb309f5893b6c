/**
 * The QQ envelope: under the true model about 95% of the points lie inside
 * their pointwise band (seeded invented data, loose bound); a badly wrong
 * model leaves many outside.
 */
import { describe, expect, it } from 'vitest';
import { createRng } from '@shared/demo/prng';
import { fittedDistribution, qqEnvelope, quantileResiduals, simulateResponses } from '@shared/diagnostics';
import { trueModel } from './simulated-sites';

const N = 300;

function model(seed: number, theta: number) {
  const rng = createRng(seed);
  const mu = Float64Array.from({ length: N }, () => Math.exp(0.5 + 1.5 * rng.uniform()));
  const m = trueModel('negbin', mu, new Float64Array(N), theta);
  return { ...m, y: simulateResponses(fittedDistribution(m), rng) };
}

describe('QQ envelope', () => {
  it('contains about 95% of the points under the true model', () => {
    const shares = [21, 22, 23].map((seed) => {
      const fit = model(seed, 2);
      return qqEnvelope(fit, quantileResiduals(fit, { seed }), { simulations: 59 }).outsideShare;
    });
    const mean = shares.reduce((a, v) => a + v, 0) / shares.length;
    expect(mean).toBeLessThan(0.15);
    expect(Math.min(...shares)).toBeLessThan(0.1);
  });

  it('a Poisson reading of overdispersed counts leaves many points outside', () => {
    const fit = model(24, 0.7);
    const asPoisson = { ...fit, distribution: 'poisson' as const, theta: null };
    const env = qqEnvelope(asPoisson, quantileResiduals(asPoisson, { seed: 1 }), { simulations: 39 });
    expect(env.outsideShare).toBeGreaterThan(0.3);
  });

  it('points are sorted, banded, seeded, and keep their table rows', () => {
    const fit = model(25, 2);
    const res = quantileResiduals(fit, { seed: 3 });
    const a = qqEnvelope(fit, res, { simulations: 19 });
    const b = qqEnvelope(fit, res, { simulations: 19 });
    expect(a.points).toEqual(b.points);
    expect(a.points).toHaveLength(N);
    a.points.forEach((p, j) => {
      expect(p.lower).toBeLessThanOrEqual(p.upper);
      if (j) {
        expect(p.theoretical).toBeGreaterThan(a.points[j - 1].theoretical);
        expect(p.residual).toBeGreaterThanOrEqual(a.points[j - 1].residual);
      }
      expect(p.residual).toBe(res.residual[p.row]); // rows are 0..N-1 here
    });
    expect(new Set(a.points.map((p) => p.row)).size).toBe(N);
    expect(a.method).toMatch(/not refitted/);
  });

  it('reports progress, can be cancelled, and refuses too few simulations', () => {
    const fit = model(26, 2);
    const res = quantileResiduals(fit);
    const seen: number[] = [];
    const signal = { aborted: false };
    expect(() =>
      qqEnvelope(fit, res, {
        simulations: 99,
        control: {
          signal,
          onProgress: (f) => {
            seen.push(f);
            if (f > 0.3) signal.aborted = true;
          },
        },
      }),
    ).toThrow(/cancelled/);
    expect(seen.length).toBeGreaterThan(0);
    expect(() => qqEnvelope(fit, res, { simulations: 5 })).toThrow(/at least 19/);
  });
});
