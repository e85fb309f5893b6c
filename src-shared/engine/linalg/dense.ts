/**
 * Small dense linear algebra on column-major Float64Array matrices
 * (entry (i, j) of an n-row matrix at [j * n + i]).
 */
import type { ColumnStructure } from './cells';
import { cellCrossprod, cellCrossprodVec, cellMatVec } from './cells';
import { allColumns, denseKernel } from './kernel';

export type { CellIndex, ColumnStructure } from './cells';
export { columnStructure, plainStructure } from './cells';

/**
 * A = X' diag(w) X (p x p, both triangles filled); w null means unit
 * weights. With a column structure that groups rows by cell, products with
 * the indicator columns are taken cell by cell.
 */
export function weightedCrossprod(
  x: Float64Array,
  n: number,
  p: number,
  w: Float64Array | null,
  out = new Float64Array(p * p),
  structure?: ColumnStructure,
): Float64Array {
  out.fill(0);
  if (structure?.cells) cellCrossprod(n, p, w, structure, out);
  else denseKernel(x, n, p, w, allColumns(p), out);
  // Entry (j, k) with j < k is held at k * p + j; mirror it.
  for (let j = 0; j < p; j++) for (let k = j + 1; k < p; k++) out[j * p + k] = out[k * p + j];
  return out;
}

/** b = X' v (length p); with a cell structure the indicator columns are summed by cell. */
export function crossprodVec(x: Float64Array, n: number, p: number, v: Float64Array, out = new Float64Array(p), structure?: ColumnStructure): Float64Array {
  const cols = structure?.cells ? structure.dense : null;
  if (cols) {
    out.fill(0);
    cellCrossprodVec(n, v, structure!, out);
  }
  const m = cols ? cols.length : p;
  for (let q = 0; q < m; q++) {
    const j = cols ? cols[q] : q;
    const oj = j * n;
    let s = 0;
    for (let i = 0; i < n; i++) s += x[oj + i] * v[i];
    out[j] = s;
  }
  return out;
}

/** out = X b (+ offset); with a cell structure the indicator columns are added by cell. */
export function matVec(
  x: Float64Array,
  n: number,
  p: number,
  b: ArrayLike<number>,
  offset: Float64Array | null,
  out: Float64Array = new Float64Array(n),
  structure?: ColumnStructure,
): Float64Array {
  if (offset) out.set(offset);
  else out.fill(0);
  const cols = structure?.cells ? structure.dense : null;
  if (cols) cellMatVec(n, b, structure!, out);
  const m = cols ? cols.length : p;
  for (let q = 0; q < m; q++) {
    const j = cols ? cols[q] : q;
    const bj = b[j];
    if (bj === 0) continue;
    const oj = j * n;
    for (let i = 0; i < n; i++) out[i] += x[oj + i] * bj;
  }
  return out;
}

/**
 * In-place Cholesky A = L L' of a symmetric positive definite p x p matrix
 * (lower triangle written, upper left as is). Returns the index of the first
 * non-positive pivot, or -1 on success.
 */
export function cholesky(a: Float64Array, p: number): number {
  for (let j = 0; j < p; j++) {
    let d = a[j * p + j];
    for (let k = 0; k < j; k++) d -= a[k * p + j] * a[k * p + j];
    if (!(d > 0)) return j;
    const ljj = Math.sqrt(d);
    a[j * p + j] = ljj;
    for (let i = j + 1; i < p; i++) {
      let s = a[j * p + i];
      for (let k = 0; k < j; k++) s -= a[k * p + i] * a[k * p + j];
      a[j * p + i] = s / ljj;
    }
  }
  return -1;
}

/** Solves L L' x = b in place (b becomes x), L from `cholesky`. */
export function choleskySolve(l: Float64Array, p: number, b: Float64Array): Float64Array {
  for (let i = 0; i < p; i++) {
    let s = b[i];
    for (let k = 0; k < i; k++) s -= l[k * p + i] * b[k];
    b[i] = s / l[i * p + i];
  }
  for (let i = p - 1; i >= 0; i--) {
    let s = b[i];
    for (let k = i + 1; k < p; k++) s -= l[i * p + k] * b[k];
    b[i] = s / l[i * p + i];
  }
  return b;
}

/** The inverse A^-1 (full, symmetric) from the Cholesky factor of A. */
export function choleskyInverse(l: Float64Array, p: number): Float64Array {
  const inv = new Float64Array(p * p);
  const e = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    e.fill(0);
    e[j] = 1;
    choleskySolve(l, p, e);
    inv.set(e, j * p);
  }
  return inv;
}

/**
 * Solves the symmetric positive definite system A x = b with Jacobi
 * scaling (D A D with D = diag(A)^-1/2) for accuracy on badly scaled
 * columns. Returns null when A is not positive definite. `inverse` asks for
 * A^-1 as well.
 */
export function solveSpd(a: Float64Array, p: number, b: Float64Array, inverse = false): { x: Float64Array; inverse: Float64Array | null } | null {
  const d = new Float64Array(p);
  for (let j = 0; j < p; j++) {
    const ajj = a[j * p + j];
    if (!(ajj > 0)) return null;
    d[j] = 1 / Math.sqrt(ajj);
  }
  const s = new Float64Array(p * p);
  for (let j = 0; j < p; j++) for (let i = 0; i < p; i++) s[j * p + i] = a[j * p + i] * d[i] * d[j];
  if (cholesky(s, p) >= 0) return null;
  const x = new Float64Array(p);
  for (let i = 0; i < p; i++) x[i] = b[i] * d[i];
  choleskySolve(s, p, x);
  for (let i = 0; i < p; i++) x[i] *= d[i];
  let inv: Float64Array | null = null;
  if (inverse) {
    inv = choleskyInverse(s, p);
    for (let j = 0; j < p; j++) for (let i = 0; i < p; i++) inv[j * p + i] *= d[i] * d[j];
  }
  return { x, inverse: inv };
}
