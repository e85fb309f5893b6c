import digamma from '@stdlib/math-base-special-digamma';
import trigamma from '@stdlib/math-base-special-trigamma';
import { describe, expect, it } from 'vitest';
import { countTable, digammaSums, lgammaRatioSum, logFactorialSum } from '@shared/engine/negbin/count-table';
import { lgamma } from '@shared/engine/math/lgamma';
import { rng } from './helpers/simulate';

// The per-distinct-count sums must equal the sums over observations written out
// directly: finite sums for small counts, Gamma-function differences for large ones.
function direct(y: Float64Array, w: Float64Array | null, t: number) {
  let psi = 0;
  let tri = 0;
  let lg = 0;
  let lf = 0;
  for (let i = 0; i < y.length; i++) {
    const wi = w ? w[i] : 1;
    psi += wi * (digamma(t + y[i]) - digamma(t));
    tri += wi * (trigamma(t) - trigamma(t + y[i]));
    lg += wi * (lgamma(y[i] + t) - lgamma(t));
    lf += wi * lgamma(y[i] + 1);
  }
  return { psi, tri, lg, lf };
}

describe('count table', () => {
  const u = rng(21);
  // Mostly small counts, some zeros, a few large ones (past the finite-sum range).
  const y = Float64Array.from({ length: 3000 }, () => (u() < 0.05 ? 60 + Math.floor(u() * 400) : Math.floor(u() * u() * 30)));
  const w = Float64Array.from({ length: y.length }, () => 0.5 + u());

  it('tallies each distinct count once, increasing, with its weight', () => {
    const tab = countTable(y, w);
    expect(Array.from(tab.values)).toEqual([...new Set(y)].sort((a, b) => a - b));
    let total = 0;
    w.forEach((v) => (total += v));
    expect(tab.weight.reduce((a, b) => a + b, 0)).toBeCloseTo(total, 9);
  });

  it.each([0.3, 2, 45, 1e6])('gives the sums over observations (theta %s)', (t) => {
    for (const ww of [null, w]) {
      const tab = countTable(y, ww);
      const d = direct(y, ww, t);
      const g = digammaSums(tab, t);
      expect(Math.abs(g.psi - d.psi)).toBeLessThan(1e-9 * Math.max(1, Math.abs(d.psi)));
      expect(Math.abs(g.tri - d.tri)).toBeLessThan(1e-9 * Math.max(1, Math.abs(d.tri)));
      expect(Math.abs(lgammaRatioSum(tab, t) - d.lg)).toBeLessThan(1e-9 * Math.max(1, Math.abs(d.lg)));
      expect(Math.abs(logFactorialSum(tab) - d.lf)).toBeLessThan(1e-9 * Math.max(1, Math.abs(d.lf)));
    }
  });

  it('groups non-integer and very large values as well', () => {
    const z = Float64Array.of(2.5, 2.5, 3e6, 0, 3e6);
    const tab = countTable(z);
    expect(Array.from(tab.values)).toEqual([0, 2.5, 3e6]);
    expect(Array.from(tab.weight)).toEqual([1, 2, 2]);
  });
});
