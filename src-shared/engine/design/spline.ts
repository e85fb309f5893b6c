/**
 * Natural cubic regression spline basis: cubic B-splines (de Boor, A
 * Practical Guide to Splines, 1978) constrained to have zero second
 * derivative at the boundary knots, hence linear beyond them. The
 * construction is the customary one, so that coefficients can be compared
 * with reference fits column for column (test/engine/design.test.ts):
 * interior knots at sample quantiles (type 7) of x, boundary knots at its
 * range, no intercept column, the two constraints removed by the orthogonal
 * complement from a Householder QR of the constraint matrix (reflection
 * sign convention below), and linear extrapolation outside the boundary.
 */

export interface SplineKnots {
  /** Interior knots (df - 1 of them). */
  readonly interior: readonly number[];
  /** Lower and upper boundary knots. */
  readonly boundary: readonly [number, number];
}

/** Sample quantile, type 7 (linear interpolation between order statistics). */
export function quantile7(sorted: ArrayLike<number>, p: number): number {
  const n = sorted.length;
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(lo + 1, n - 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

/** Knots for a natural spline with `df` columns on the data x. */
export function splineKnots(x: ArrayLike<number>, df: number): SplineKnots {
  const sorted = Float64Array.from(x).sort();
  const nInterior = df - 1;
  const interior: number[] = [];
  for (let k = 1; k <= nInterior; k++) interior.push(quantile7(sorted, k / (nInterior + 1)));
  return { interior, boundary: [sorted[0], sorted[sorted.length - 1]] };
}

/**
 * Values (or derivatives of order `deriv`) at x of all B-splines of order
 * `ord` on the knot sequence t (length t.length - ord). The interval is
 * closed on the right at the last knot.
 */
export function bsplineValues(x: number, t: ArrayLike<number>, ord: number, deriv = 0): Float64Array {
  const nk = t.length;
  if (deriv > 0) {
    // B'_{i,k} = (k-1) [B_{i,k-1}/(t_{i+k-1}-t_i) - B_{i+1,k-1}/(t_{i+k}-t_{i+1})]
    const lower = bsplineValues(x, t, ord - 1, deriv - 1);
    const out = new Float64Array(nk - ord);
    for (let i = 0; i < nk - ord; i++) {
      const d1 = t[i + ord - 1] - t[i];
      const d2 = t[i + ord] - t[i + 1];
      const a = d1 > 0 ? lower[i] / d1 : 0;
      const b = d2 > 0 ? lower[i + 1] / d2 : 0;
      out[i] = (ord - 1) * (a - b);
    }
    return out;
  }
  // Order 1: the indicator of the knot interval holding x.
  let b = new Float64Array(nk - 1);
  let interval = -1;
  for (let i = 0; i < nk - 1; i++) {
    if (t[i] < t[i + 1] && x >= t[i] && x < t[i + 1]) {
      interval = i;
      break;
    }
  }
  if (interval < 0 && x === t[nk - 1]) {
    for (let i = nk - 2; i >= 0; i--) {
      if (t[i] < t[i + 1]) {
        interval = i;
        break;
      }
    }
  }
  if (interval >= 0) b[interval] = 1;
  for (let k = 2; k <= ord; k++) {
    const next = new Float64Array(nk - k);
    for (let i = 0; i < nk - k; i++) {
      const d1 = t[i + k - 1] - t[i];
      const d2 = t[i + k] - t[i + 1];
      let v = 0;
      if (d1 > 0) v += ((x - t[i]) / d1) * b[i];
      if (d2 > 0) v += ((t[i + k] - x) / d2) * b[i + 1];
      next[i] = v;
    }
    b = next;
  }
  return b;
}

/**
 * Householder QR of an m x 2 matrix (column-major), reflector
 * v = x / (sign(x_1) ||x||) + e_1, the sign convention of the classical
 * column-pivoting QR routines; returns what `applyQt` needs.
 */
function householder2(a: Float64Array, m: number): { qr: Float64Array; qraux: Float64Array } {
  const qr = Float64Array.from(a);
  const qraux = new Float64Array(2);
  for (let l = 0; l < 2; l++) {
    const off = l * m;
    let nrm = 0;
    for (let i = l; i < m; i++) nrm += qr[off + i] * qr[off + i];
    nrm = Math.sqrt(nrm);
    if (nrm === 0) continue;
    if (qr[off + l] !== 0) nrm = Math.sign(qr[off + l]) * Math.abs(nrm);
    for (let i = l; i < m; i++) qr[off + i] /= nrm;
    qr[off + l] += 1;
    for (let j = l + 1; j < 2; j++) {
      const oj = j * m;
      let s = 0;
      for (let i = l; i < m; i++) s += qr[off + i] * qr[oj + i];
      const tt = -s / qr[off + l];
      for (let i = l; i < m; i++) qr[oj + i] += tt * qr[off + i];
    }
    qraux[l] = qr[off + l];
    qr[off + l] = -nrm;
  }
  return { qr, qraux };
}

/** y <- Q' y in place, for the factorisation from householder2. */
function applyQt(h: { qr: Float64Array; qraux: Float64Array }, m: number, y: Float64Array): void {
  for (let j = 0; j < 2; j++) {
    const aux = h.qraux[j];
    if (aux === 0) continue;
    const off = j * m;
    const diag = h.qr[off + j];
    h.qr[off + j] = aux;
    let s = 0;
    for (let i = j; i < m; i++) s += h.qr[off + i] * y[i];
    const tt = -s / h.qr[off + j];
    for (let i = j; i < m; i++) y[i] += tt * h.qr[off + i];
    h.qr[off + j] = diag;
  }
}

/**
 * The natural spline basis at x for the given knots: x.length rows and
 * interior.length + 1 columns, column-major.
 */
export function naturalSplineBasis(x: ArrayLike<number>, knots: SplineKnots): Float64Array {
  const [lo, hi] = knots.boundary;
  const t = [lo, lo, lo, lo, ...knots.interior, hi, hi, hi, hi];
  const nb = t.length - 4; // B-splines of order 4
  const m = nb - 1; // after dropping the first (no intercept)
  const df = m - 2;
  // Constraint matrix t(const): m x 2, second derivatives at both boundaries.
  const c = new Float64Array(m * 2);
  const cl = bsplineValues(lo, t, 4, 2);
  const ch = bsplineValues(hi, t, 4, 2);
  for (let i = 0; i < m; i++) {
    c[i] = cl[i + 1];
    c[m + i] = ch[i + 1];
  }
  const h = householder2(c, m);
  const n = x.length;
  const out = new Float64Array(n * df);
  const row = new Float64Array(m);
  const atLo = bsplineValues(lo, t, 4, 0);
  const atHi = bsplineValues(hi, t, 4, 0);
  const slopeLo = bsplineValues(lo, t, 4, 1);
  const slopeHi = bsplineValues(hi, t, 4, 1);
  for (let r = 0; r < n; r++) {
    const xr = x[r];
    let b: Float64Array;
    if (xr < lo) {
      b = new Float64Array(nb);
      for (let i = 0; i < nb; i++) b[i] = atLo[i] + (xr - lo) * slopeLo[i];
    } else if (xr > hi) {
      b = new Float64Array(nb);
      for (let i = 0; i < nb; i++) b[i] = atHi[i] + (xr - hi) * slopeHi[i];
    } else {
      b = bsplineValues(xr, t, 4, 0);
    }
    for (let i = 0; i < m; i++) row[i] = b[i + 1];
    applyQt(h, m, row);
    for (let j = 0; j < df; j++) out[j * n + r] = row[j + 2];
  }
  return out;
}
