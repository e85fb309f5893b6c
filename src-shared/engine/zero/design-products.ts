/**
 * The one design-matrix product the shared dense helpers (../linalg/dense.ts)
 * do not have: a weighted cross block A' diag(w) B of two different designs,
 * written into a block of a larger symmetric matrix (both triangles).
 */
import type { Design } from '../types';

/** H[r0 + j, c0 + l] = H[c0 + l, r0 + j] = sum_i A[i, j] w[i] B[i, l]; H is k x k column-major. */
export function addCrossBlock(A: Design, B: Design, w: Float64Array, H: Float64Array, k: number, r0: number, c0: number): void {
  const n = A.n;
  const wa = new Float64Array(n);
  for (let j = 0; j < A.p; j++) {
    const aj = j * n;
    for (let i = 0; i < n; i++) wa[i] = A.data[aj + i] * w[i];
    for (let l = 0; l < B.p; l++) {
      const bl = l * n;
      let s = 0;
      for (let i = 0; i < n; i++) s += wa[i] * B.data[bl + i];
      H[(c0 + l) * k + r0 + j] = s;
      H[(r0 + j) * k + c0 + l] = s;
    }
  }
}

/** Copies a p x p symmetric matrix into block (at, at) of a k x k one. */
export function placeBlock(src: Float64Array, p: number, H: Float64Array, k: number, at: number): void {
  for (let j = 0; j < p; j++) for (let i = 0; i < p; i++) H[(at + j) * k + at + i] = src[j * p + i];
}

/** Sum of the entries. */
export function total(w: Float64Array): number {
  let s = 0;
  for (let i = 0; i < w.length; i++) s += w[i];
  return s;
}
