/**
 * Hessian by central differences of an analytic gradient, symmetrised:
 * H_ij = (g_i(x + h_j e_j) - g_i(x - h_j e_j)) / (2 h_j), h_j = step * max(1, |x_j|).
 */
export function hessianFromGradient(gradient: (par: Float64Array) => Float64Array, x: Float64Array, step = 1e-4): Float64Array {
  const k = x.length;
  const H = new Float64Array(k * k);
  const xp = Float64Array.from(x);
  for (let j = 0; j < k; j++) {
    const h = step * Math.max(1, Math.abs(x[j]));
    xp[j] = x[j] + h;
    const gp = gradient(xp);
    xp[j] = x[j] - h;
    const gm = gradient(xp);
    xp[j] = x[j];
    for (let i = 0; i < k; i++) H[j * k + i] = (gp[i] - gm[i]) / (2 * h);
  }
  for (let j = 0; j < k; j++) {
    for (let i = j + 1; i < k; i++) {
      const m = 0.5 * (H[j * k + i] + H[i * k + j]);
      H[j * k + i] = m;
      H[i * k + j] = m;
    }
  }
  return H;
}
