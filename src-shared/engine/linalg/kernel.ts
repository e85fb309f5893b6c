/**
 * The blocked kernel of the weighted cross-product X' diag(w) X over a list
 * of columns of a column-major matrix.
 */

/** Rows per block in the cross-products: a block of all columns stays in cache. */
const BLOCK = 1024;

/**
 * Sums over dense columns: for positions jj <= kk in `cols` adds
 * sum_i w_i x_ij x_ik to out[k * p + j] (j = cols[jj], k = cols[kk]; for
 * increasing `cols` this is the lower triangle). Rows are taken in blocks so
 * that each block of the columns is read from cache for all the sums.
 */
export function denseKernel(x: Float64Array, n: number, p: number, w: Float64Array | null, cols: Int32Array, out: Float64Array): void {
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

/** The column positions 0 ... p - 1. */
export function allColumns(p: number): Int32Array {
  const c = new Int32Array(p);
  for (let j = 0; j < p; j++) c[j] = j;
  return c;
}
