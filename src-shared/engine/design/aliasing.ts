/**
 * Detection of aliased (linearly dependent) design columns.
 *
 * Columns are taken in order, as a rank-revealing QR that only moves
 * dependent columns to the end would take them: a column
 * whose part orthogonal to the kept columns is below `tol` times its own
 * length depends on earlier ones and is dropped.
 *
 * Computed from the cross-product matrix X'X (one blocked pass over the
 * data, n p^2 / 2 multiply-adds) by a Cholesky factorisation in column
 * order on the unit-diagonal (correlation-like) scaling: the pivot of column
 * j is then exactly its squared relative residual length. Because X'X
 * squares the condition number, the default threshold is on the squared
 * ratio, 1e-9 (a relative residual length of about 3e-5): a column that is
 * a combination of others up to that is treated as aliased.
 */
import type { ColumnStructure } from '../linalg/dense';
import { columnStructure, weightedCrossprod } from '../linalg/dense';

/** Positions of the aliased columns; `structure` is the design's column structure when the caller has it. */
export function findAliased(data: Float64Array, n: number, p: number, tol = 1e-9, structure?: ColumnStructure): number[] {
  const a = weightedCrossprod(data, n, p, null, undefined, structure ?? columnStructure(data, n, p));
  return aliasedFromCrossprod(a, p, tol);
}

/** The same test on a given cross-product matrix A = X'X (p x p, column-major). */
export function aliasedFromCrossprod(a: Float64Array, p: number, tol = 1e-9): number[] {
  const d = new Float64Array(p);
  for (let j = 0; j < p; j++) d[j] = a[j * p + j] > 0 ? 1 / Math.sqrt(a[j * p + j]) : 0;
  // l: lower Cholesky factor of the scaled matrix restricted to kept columns.
  const l = new Float64Array(p * p);
  const kept: number[] = [];
  const aliased: number[] = [];
  for (let j = 0; j < p; j++) {
    if (d[j] === 0) {
      aliased.push(j);
      continue;
    }
    // Row j of L against the kept columns: solve L_kk r = s_kj.
    const r = new Float64Array(kept.length);
    for (let q = 0; q < kept.length; q++) {
      const k = kept[q];
      let s = a[j * p + k] * d[j] * d[k];
      for (let m = 0; m < q; m++) s -= l[kept[m] * p + k] * r[m];
      r[q] = s / l[k * p + k];
    }
    let pivot = 1;
    for (let q = 0; q < r.length; q++) pivot -= r[q] * r[q];
    if (pivot <= tol) {
      aliased.push(j);
      continue;
    }
    for (let q = 0; q < kept.length; q++) l[kept[q] * p + j] = r[q];
    l[j * p + j] = Math.sqrt(pivot);
    kept.push(j);
  }
  return aliased;
}
