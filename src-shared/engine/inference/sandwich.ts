/**
 * Cluster-robust (sandwich) covariance for a GLM fitted by IRLS:
 *
 *   V = c * B (sum_g u_g u_g') B,   u_g = sum_{i in g} x_i s_i,
 *   s_i = prior_i * (y_i - mu_i) * mu'(eta_i) / V(mu_i)   (the score of obs. i),
 *   B = (X'WX)^-1,   c = G/(G-1) * (n-1)/(n-p),
 *
 * the usual small-sample correction (Cameron & Miller 2015, "A
 * Practitioner's Guide to Cluster-Robust Inference", Journal of Human
 * Resources 50(2), 317-372; HC1-type scaling with the G/(G-1) cluster
 * factor). p counts every mean parameter, fixed site
 * effects included. For the negative binomial theta is held at its estimate.
 */
export interface SandwichInput {
  readonly x: Float64Array;
  readonly n: number;
  readonly p: number;
  /** Per-observation score factor s_i (so the score vector of i is x_i s_i). */
  readonly score: Float64Array;
  /** (X'WX)^-1, p x p. */
  readonly bread: Float64Array;
  /** Cluster index 0..G-1 of each row. */
  readonly cluster: Int32Array;
  readonly clusters: number;
}

export function clusterSandwich(input: SandwichInput): Float64Array {
  const { x, n, p, score, bread, cluster, clusters: G } = input;
  // u (G x p, row-major by cluster): sums of the score vectors within clusters.
  const u = new Float64Array(G * p);
  for (let j = 0; j < p; j++) {
    const oj = j * n;
    for (let i = 0; i < n; i++) u[cluster[i] * p + j] += x[oj + i] * score[i];
  }
  const meat = new Float64Array(p * p);
  for (let g = 0; g < G; g++) {
    const og = g * p;
    for (let j = 0; j < p; j++) {
      const uj = u[og + j];
      if (uj === 0) continue;
      for (let k = 0; k < p; k++) meat[k * p + j] += uj * u[og + k];
    }
  }
  const bm = multiply(bread, meat, p);
  const v = multiply(bm, bread, p);
  const c = (G / (G - 1)) * ((n - 1) / (n - p));
  for (let i = 0; i < v.length; i++) v[i] *= c;
  return v;
}

function multiply(a: Float64Array, b: Float64Array, p: number): Float64Array {
  const out = new Float64Array(p * p);
  for (let j = 0; j < p; j++) {
    for (let k = 0; k < p; k++) {
      const bkj = b[j * p + k];
      if (bkj === 0) continue;
      for (let i = 0; i < p; i++) out[j * p + i] += a[k * p + i] * bkj;
    }
  }
  return out;
}

/** Cluster indices for the given texts (one cluster per distinct text, in first-seen order). */
export function clusterIndex(labels: readonly string[]): { index: Int32Array; levels: string[] } {
  const map = new Map<string, number>();
  const index = new Int32Array(labels.length);
  labels.forEach((t, i) => {
    let g = map.get(t);
    if (g === undefined) {
      g = map.size;
      map.set(t, g);
    }
    index[i] = g;
  });
  return { index, levels: [...map.keys()] };
}
