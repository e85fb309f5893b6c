/**
 * Gauss-Hermite rules against published values and exact moments.
 */
import { describe, expect, it } from 'vitest';
import { gaussHermite } from '@shared/engine/sites/gauss-hermite';

describe('Gauss-Hermite nodes and weights', () => {
  it('match the closed forms for 2 and 3 nodes (roots of H2 = 4x^2 - 2 and H3 = 8x^3 - 12x)', () => {
    const r2 = gaussHermite(2);
    expect(r2.nodes[1]).toBeCloseTo(Math.SQRT1_2, 14);
    expect(r2.weights[0]).toBeCloseTo(Math.sqrt(Math.PI) / 2, 14);
    const r3 = gaussHermite(3);
    expect(r3.nodes[1]).toBe(0);
    expect(r3.nodes[2]).toBeCloseTo(Math.sqrt(1.5), 14);
    expect(r3.weights[1]).toBeCloseTo((2 * Math.sqrt(Math.PI)) / 3, 14);
    expect(r3.weights[2]).toBeCloseTo(Math.sqrt(Math.PI) / 6, 14);
  });

  it('match Abramowitz & Stegun table 25.10 for 5 and 20 nodes (values from memory of the table)', () => {
    const r5 = gaussHermite(5);
    expect(r5.nodes[3]).toBeCloseTo(0.958572464613819, 12);
    expect(r5.nodes[4]).toBeCloseTo(2.020182870456086, 12);
    expect(r5.weights[2]).toBeCloseTo(0.945308720482942, 12);
    expect(r5.weights[3]).toBeCloseTo(0.393619323152241, 12);
    expect(r5.weights[4]).toBeCloseTo(0.019953242059046, 12);
    const r20 = gaussHermite(20);
    expect(r20.nodes[19]).toBeCloseTo(5.387480890011233, 11);
    expect(r20.nodes[10]).toBeCloseTo(0.245340708300901, 12);
    expect(r20.weights[10]).toBeCloseTo(0.462243669600610, 12);
    expect(r20.weights[19] / 2.229393645534151e-13).toBeCloseTo(1, 8);
  });

  it('integrate x^(2m) exp(-x^2) exactly for 2m < 2n (= Gamma(m + 1/2), a standard identity)', () => {
    for (const n of [1, 4, 9, 15, 30]) {
      const r = gaussHermite(n);
      let g = Math.sqrt(Math.PI); // Gamma(1/2)
      for (let m = 0; m < n; m++) {
        let s = 0;
        for (let k = 0; k < n; k++) s += r.weights[k] * r.nodes[k] ** (2 * m);
        expect(s / g, `n=${n} m=${m}`).toBeCloseTo(1, 9);
        let odd = 0;
        for (let k = 0; k < n; k++) odd += r.weights[k] * r.nodes[k] ** (2 * m + 1);
        expect(Math.abs(odd)).toBeLessThan(1e-9 * g);
        g *= m + 0.5;
      }
    }
  });

  it('refuses a node count out of range', () => {
    expect(() => gaussHermite(0)).toThrow(RangeError);
  });
});
