import { describe, expect, it } from 'vitest';
import { choleskyInverse, cholesky, columnStructure, crossprodVec, matVec, solveSpd, weightedCrossprod } from '@shared/engine/linalg/dense';
import { rng } from './helpers/simulate';

function naiveCrossprod(x: Float64Array, n: number, p: number, w: Float64Array | null): Float64Array {
  const out = new Float64Array(p * p);
  for (let j = 0; j < p; j++) for (let k = 0; k < p; k++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += (w ? w[i] : 1) * x[j * n + i] * x[k * n + i];
    out[k * p + j] = s;
  }
  return out;
}

describe('dense linear algebra', () => {
  const u = rng(11);
  it.each([
    [5, 1],
    [7, 2],
    [3000, 3],
    [2500, 5],
    [1100, 14],
    [10, 9],
  ])('blocked X\'WX equals the plain sums (n = %i, p = %i)', (n, p) => {
    const x = Float64Array.from({ length: n * p }, () => u() - 0.3);
    const w = Float64Array.from({ length: n }, () => u());
    for (const ww of [w, null]) {
      const a = weightedCrossprod(x, n, p, ww);
      const b = naiveCrossprod(x, n, p, ww);
      for (let i = 0; i < p * p; i++) expect(Math.abs(a[i] - b[i])).toBeLessThan(1e-10 * Math.max(1, Math.abs(b[i])));
    }
  });

  it('X\'WX with indicator columns summed over their rows equals the plain sums', () => {
    const n = 2300;
    // intercept, two numeric, a 4-level factor's 3 dummies, a numeric x dummy product, and 30 site dummies
    const cols: number[][] = [Array(n).fill(1), Array.from({ length: n }, () => u()), Array.from({ length: n }, () => u() - 0.5)];
    const f = Array.from({ length: n }, () => Math.floor(u() * 4));
    for (let l = 1; l < 4; l++) cols.push(f.map((v) => (v === l ? 1 : 0)));
    cols.push(cols[1].map((v, i) => v * cols[3][i]));
    for (let g = 0; g < 30; g++) cols.push(Array.from({ length: n }, (_, i) => (i % 30 === g ? 1 : 0)));
    const p = cols.length;
    const x = Float64Array.from(cols.flat());
    const st = columnStructure(x, n, p);
    // The intercept, the 3 dummies and the 30 sites are 0/1 and are taken cell by cell (4 x 30 cells at most).
    expect(Array.from(st.dense)).toEqual([1, 2, 6]);
    expect(st.indicator.length).toBe(34);
    expect(st.cells!.count).toBeLessThanOrEqual(120);
    // With no 0/1 column there is nothing to group: the plain kernel for all.
    expect(columnStructure(x.subarray(n, n * 3), n, 2).cells).toBeNull();
    const w = Float64Array.from({ length: n }, () => u());
    for (const ww of [w, null]) {
      const a = weightedCrossprod(x, n, p, ww, undefined, st);
      const b = naiveCrossprod(x, n, p, ww);
      for (let i = 0; i < p * p; i++) expect(Math.abs(a[i] - b[i])).toBeLessThan(1e-10 * Math.max(1, Math.abs(b[i])));
    }
    // X'v and X b by cell equal the plain sums.
    const v = Float64Array.from({ length: n }, () => u() - 0.5);
    const beta = Float64Array.from({ length: p }, () => u() - 0.5);
    const plainXv = crossprodVec(x, n, p, v);
    crossprodVec(x, n, p, v, undefined, st).forEach((s, j) => expect(Math.abs(s - plainXv[j])).toBeLessThan(1e-10 * Math.max(1, Math.abs(plainXv[j]))));
    const off = Float64Array.from({ length: n }, () => u());
    const plainXb = matVec(x, n, p, beta, off);
    matVec(x, n, p, beta, off, undefined, st).forEach((s, i) => expect(Math.abs(s - plainXb[i])).toBeLessThan(1e-12 * Math.max(1, Math.abs(plainXb[i]))));
  });

  it('groups the rows of a small factor design by cell and keeps the sums', () => {
    // intercept, one numeric and two factors (3 and 4 levels): 2 + 3 dummies, 12 cells
    const n = 1500;
    const f1 = Array.from({ length: n }, () => Math.floor(u() * 3));
    const f2 = Array.from({ length: n }, () => Math.floor(u() * 4));
    const cols: number[][] = [Array(n).fill(1), Array.from({ length: n }, () => u() * 2 - 1)];
    for (let l = 1; l < 3; l++) cols.push(f1.map((v) => (v === l ? 1 : 0)));
    for (let l = 1; l < 4; l++) cols.push(f2.map((v) => (v === l ? 1 : 0)));
    const p = cols.length;
    const x = Float64Array.from(cols.flat());
    const st = columnStructure(x, n, p);
    expect(st.cells!.count).toBe(12);
    const w = Float64Array.from({ length: n }, () => u());
    const a = weightedCrossprod(x, n, p, w, undefined, st);
    const b = naiveCrossprod(x, n, p, w);
    for (let i = 0; i < p * p; i++) expect(Math.abs(a[i] - b[i])).toBeLessThan(1e-10 * Math.max(1, Math.abs(b[i])));
  });

  it('solves and inverts a symmetric positive definite system', () => {
    const n = 50;
    const p = 4;
    const x = Float64Array.from({ length: n * p }, () => u());
    const a = weightedCrossprod(x, n, p, null);
    const beta = Float64Array.from([1, -2, 0.5, 3]);
    const yhat = matVec(x, n, p, beta, null);
    const b = crossprodVec(x, n, p, yhat);
    const sol = solveSpd(a, p, b, true)!;
    sol.x.forEach((v, j) => expect(v).toBeCloseTo(beta[j], 9));
    // A A^-1 = I
    for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) {
      let s = 0;
      for (let k = 0; k < p; k++) s += a[k * p + i] * sol.inverse![j * p + k];
      expect(s).toBeCloseTo(i === j ? 1 : 0, 9);
    }
    const l = Float64Array.from(a);
    expect(cholesky(l, p)).toBe(-1);
    const inv = choleskyInverse(l, p);
    for (let i = 0; i < p * p; i++) expect(inv[i]).toBeCloseTo(sol.inverse![i], 9);
  });

  it('reports a matrix that is not positive definite', () => {
    expect(solveSpd(Float64Array.from([1, 2, 2, 4]), 2, Float64Array.from([1, 1]))).toBeNull();
    expect(cholesky(Float64Array.from([1, 2, 2, 1]), 2)).toBe(1);
  });
});
