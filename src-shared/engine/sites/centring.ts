/**
 * Centring and scaling of design columns for the optimiser, and the exact
 * map back. A column such as the season (2012 ... 2026) next to an intercept
 * makes the marginal likelihood a long narrow ridge that a quasi-Newton
 * search crawls along; on centred, unit-scale columns the same model is well
 * conditioned. The linear predictor, and so the likelihood, fitted means and
 * site modes, are unchanged: only the coordinates of beta differ.
 *
 * With x~_j = (x_j - m_j) / s_j for every column but the intercept (column
 * `interceptIndex`), beta_j = b~_j / s_j and
 * beta_0 = b~_0 - sum_j b~_j m_j / s_j; so beta = T b~ and Cov(beta) = T C~ T'.
 */
export interface Centring {
  readonly x: Float64Array;
  readonly means: Float64Array;
  readonly scales: Float64Array;
  readonly interceptIndex: number;
}

export function centreColumns(data: Float64Array, n: number, p: number, interceptIndex: number): Centring {
  const x = new Float64Array(data);
  const means = new Float64Array(p);
  const scales = new Float64Array(p).fill(1);
  for (let j = 0; j < p; j++) {
    if (j === interceptIndex) continue;
    const col = x.subarray(j * n, (j + 1) * n);
    let m = 0;
    for (let i = 0; i < n; i++) m += col[i];
    m /= n;
    let ss = 0;
    for (let i = 0; i < n; i++) ss += (col[i] - m) ** 2;
    const s = Math.sqrt(ss / Math.max(1, n - 1));
    if (!(s > 0)) continue; // a constant column stays as it is (aliasing is reported elsewhere)
    for (let i = 0; i < n; i++) col[i] = (col[i] - m) / s;
    means[j] = m;
    scales[j] = s;
  }
  return { x, means, scales, interceptIndex };
}

/** The p x p map T (column-major) from centred to original coordinates. */
function transform(c: Centring, p: number): Float64Array {
  const t = new Float64Array(p * p);
  const k = c.interceptIndex;
  for (let j = 0; j < p; j++) {
    t[j * p + j] = 1 / c.scales[j];
    if (j !== k && k >= 0) t[j * p + k] = -c.means[j] / c.scales[j];
  }
  if (k >= 0) t[k * p + k] = 1;
  return t;
}

/** beta = T b~ and Cov = T C~ T' (both column-major, p x p). */
export function uncentre(c: Centring, beta: Float64Array, cov: Float64Array, p: number): { beta: Float64Array; covariance: Float64Array } {
  const t = transform(c, p);
  const b = new Float64Array(p);
  for (let i = 0; i < p; i++) {
    let s = 0;
    for (let j = 0; j < p; j++) s += t[j * p + i] * beta[j];
    b[i] = s;
  }
  const tc = new Float64Array(p * p); // T C~
  for (let i = 0; i < p; i++)
    for (let j = 0; j < p; j++) {
      let s = 0;
      for (let l = 0; l < p; l++) s += t[l * p + i] * cov[j * p + l];
      tc[j * p + i] = s;
    }
  const out = new Float64Array(p * p); // (T C~) T'
  for (let i = 0; i < p; i++)
    for (let j = 0; j < p; j++) {
      let s = 0;
      for (let l = 0; l < p; l++) s += tc[l * p + i] * t[l * p + j];
      out[j * p + i] = s;
    }
  return { beta: b, covariance: out };
}
