/**
 * Small dense linear algebra on column-major Float64Array matrices
 * (entry (i, j) of an n-row matrix at [j * n + i]).
 */

/** Rows per block in the cross-products: a block of all columns stays in cache. */
const BLOCK = 1024;

/**
 * Sums over dense columns: for positions jj <= kk in `cols` adds
 * sum_i w_i x_ij x_ik to out[k * p + j] (j = cols[jj], k = cols[kk]; for
 * increasing `cols` this is the lower triangle). Rows are taken in blocks so
 * that each block of the columns is read from cache for all the sums.
 */
function denseKernel(x: Float64Array, n: number, p: number, w: Float64Array | null, cols: Int32Array, out: Float64Array): void {
  const m = cols.length;
  const len0 = Math.min(BLOCK, n);
  const wa = new Float64Array(len0);
  const wb = new Float64Array(len0);
  for (let i0 = 0; i0 < n; i0 += BLOCK) {
    const i1 = Math.min(n, i0 + BLOCK);
    const len = i1 - i0;
    // Two rows of the result at a time (j, j + 1), four columns k at a time:
    // each load of x_k serves two sums and each load of w x_j four.
    for (let jj = 0; jj < m; jj += 2) {
      const two = jj + 1 < m;
      const j = cols[jj];
      const jb = two ? cols[jj + 1] : j;
      const oa = j * n + i0;
      const ob = jb * n + i0;
      if (w) {
        for (let i = 0; i < len; i++) wa[i] = w[i0 + i] * x[oa + i];
        if (two) for (let i = 0; i < len; i++) wb[i] = w[i0 + i] * x[ob + i];
      } else {
        for (let i = 0; i < len; i++) wa[i] = x[oa + i];
        if (two) for (let i = 0; i < len; i++) wb[i] = x[ob + i];
      }
      let kk = jj;
      for (; kk + 3 < m; kk += 4) {
        const k0 = cols[kk];
        const k1 = cols[kk + 1];
        const k2 = cols[kk + 2];
        const k3 = cols[kk + 3];
        const o0 = k0 * n + i0;
        const o1 = k1 * n + i0;
        const o2 = k2 * n + i0;
        const o3 = k3 * n + i0;
        let a0 = 0;
        let a1 = 0;
        let a2 = 0;
        let a3 = 0;
        let b0 = 0;
        let b1 = 0;
        let b2 = 0;
        let b3 = 0;
        if (two) {
          for (let i = 0; i < len; i++) {
            const va = wa[i];
            const vb = wb[i];
            const x0 = x[o0 + i];
            const x1 = x[o1 + i];
            const x2 = x[o2 + i];
            const x3 = x[o3 + i];
            a0 += va * x0;
            a1 += va * x1;
            a2 += va * x2;
            a3 += va * x3;
            b0 += vb * x0;
            b1 += vb * x1;
            b2 += vb * x2;
            b3 += vb * x3;
          }
        } else {
          for (let i = 0; i < len; i++) {
            const va = wa[i];
            a0 += va * x[o0 + i];
            a1 += va * x[o1 + i];
            a2 += va * x[o2 + i];
            a3 += va * x[o3 + i];
          }
        }
        out[k0 * p + j] += a0;
        out[k1 * p + j] += a1;
        out[k2 * p + j] += a2;
        out[k3 * p + j] += a3;
        if (two) {
          // (jb, k0) with kk = jj is the entry (j, jb) again; skip it.
          if (kk > jj) out[k0 * p + jb] += b0;
          out[k1 * p + jb] += b1;
          out[k2 * p + jb] += b2;
          out[k3 * p + jb] += b3;
        }
      }
      for (; kk < m; kk++) {
        const k = cols[kk];
        const ok = k * n + i0;
        let a = 0;
        let b = 0;
        for (let i = 0; i < len; i++) {
          const xk = x[ok + i];
          a += wa[i] * xk;
          b += wb[i] * xk;
        }
        out[k * p + j] += a;
        if (two && kk > jj) out[k * p + jb] += b;
      }
    }
  }
}

/**
 * Which columns are 0/1 indicators (factor levels, sites) and which rows they
 * mark: their cross-products only need those rows. Computed once per design.
 */
export interface ColumnStructure {
  /** Positions of the dense columns, increasing. */
  readonly dense: Int32Array;
  /** Positions of the indicator columns, increasing. */
  readonly indicator: Int32Array;
  /** For each indicator column, the rows where it is 1. */
  readonly rowsOf: readonly Int32Array[];
}

/** Columns whose values are all 0 or 1 with at most `maxFill` of them 1 count as indicators. */
export function columnStructure(x: Float64Array, n: number, p: number, maxFill = 0.5): ColumnStructure {
  const dense: number[] = [];
  const indicator: number[] = [];
  const rowsOf: Int32Array[] = [];
  for (let j = 0; j < p; j++) {
    const o = j * n;
    let ones = 0;
    let binary = true;
    for (let i = 0; i < n; i++) {
      const v = x[o + i];
      if (v === 1) ones++;
      else if (v !== 0) {
        binary = false;
        break;
      }
    }
    if (!binary || ones > maxFill * n) {
      dense.push(j);
      continue;
    }
    const idx = new Int32Array(ones);
    for (let i = 0, k = 0; i < n; i++) if (x[o + i] === 1) idx[k++] = i;
    indicator.push(j);
    rowsOf.push(idx);
  }
  // Indicator sums gather rows (about GATHER_COST times dearer per term than the
  // blocked dense kernel): use them only where they save work, as with many sites.
  let marked = 0;
  for (const r of rowsOf) marked += r.length;
  const d = dense.length;
  if (GATHER_COST * marked * p + (n * d * (d + 1)) / 2 >= (n * p * (p + 1)) / 2) {
    return { dense: allColumns(p), indicator: new Int32Array(0), rowsOf: [] };
  }
  return { dense: Int32Array.from(dense), indicator: Int32Array.from(indicator), rowsOf };
}

/** Relative cost of a gathered multiply-add against one in the dense kernel (measured, about 3-4). */
const GATHER_COST = 4;

/**
 * A = X' diag(w) X (p x p, both triangles filled); w null means unit
 * weights. With a column structure, products with indicator columns are
 * summed over the rows they mark only.
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
  if (!structure || structure.indicator.length === 0) {
    denseKernel(x, n, p, w, structure ? structure.dense : allColumns(p), out);
  } else {
    denseKernel(x, n, p, w, structure.dense, out);
    const ind = structure.indicator;
    for (let q = 0; q < ind.length; q++) {
      const s = ind[q];
      const rows = structure.rowsOf[q];
      const len = rows.length;
      const ws = new Float64Array(len);
      let diag = 0;
      for (let k = 0; k < len; k++) {
        const v = w ? w[rows[k]] : 1;
        ws[k] = v;
        diag += v;
      }
      out[s * p + s] = diag;
      // Against every dense column and the later indicator columns.
      const against = (c: number) => {
        const o = c * n;
        let a = 0;
        for (let k = 0; k < len; k++) a += ws[k] * x[o + rows[k]];
        if (c < s) out[s * p + c] = a;
        else out[c * p + s] = a;
      };
      for (let d = 0; d < structure.dense.length; d++) against(structure.dense[d]);
      for (let r = q + 1; r < ind.length; r++) against(ind[r]);
    }
  }
  // Entry (j, k) with j < k is held at k * p + j; mirror it.
  for (let j = 0; j < p; j++) for (let k = j + 1; k < p; k++) out[j * p + k] = out[k * p + j];
  return out;
}

function allColumns(p: number): Int32Array {
  const c = new Int32Array(p);
  for (let j = 0; j < p; j++) c[j] = j;
  return c;
}

/** b = X' v (length p). */
export function crossprodVec(x: Float64Array, n: number, p: number, v: Float64Array, out = new Float64Array(p)): Float64Array {
  for (let j = 0; j < p; j++) {
    const oj = j * n;
    let s = 0;
    for (let i = 0; i < n; i++) s += x[oj + i] * v[i];
    out[j] = s;
  }
  return out;
}

/** out = X b (+ offset). */
export function matVec(x: Float64Array, n: number, p: number, b: ArrayLike<number>, offset: Float64Array | null, out = new Float64Array(n)): Float64Array {
  if (offset) out.set(offset);
  else out.fill(0);
  for (let j = 0; j < p; j++) {
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
