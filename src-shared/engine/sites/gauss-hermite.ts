/**
 * Gauss-Hermite nodes and weights for integrals of f(x) exp(-x^2) over the
 * real line, by Newton's method on the orthonormal Hermite polynomials
 * (three-term recurrence, which avoids overflow for many nodes), with the
 * usual asymptotic starting guesses for the largest roots and extrapolation
 * from the roots already found for the others. Weights 2 / H'_n(x)^2 in the
 * orthonormal scaling. Nodes are returned in increasing order.
 */
export interface GaussHermiteRule {
  readonly nodes: Float64Array;
  readonly weights: Float64Array;
}

const cache = new Map<number, GaussHermiteRule>();

export function gaussHermite(n: number): GaussHermiteRule {
  if (!Number.isInteger(n) || n < 1 || n > 100) throw new RangeError(`Gauss-Hermite rule needs 1 to 100 nodes, not ${n}.`);
  const hit = cache.get(n);
  if (hit) return hit;
  const x = new Float64Array(n);
  const w = new Float64Array(n);
  const pim4 = Math.PI ** -0.25;
  const m = Math.floor((n + 1) / 2);
  let z = 0;
  for (let i = 0; i < m; i++) {
    if (i === 0) z = Math.sqrt(2 * n + 1) - 1.85575 * (2 * n + 1) ** (-1 / 6);
    else if (i === 1) z -= (1.14 * n ** 0.426) / z;
    else if (i === 2) z = 1.86 * z - 0.86 * x[0];
    else if (i === 3) z = 1.91 * z - 0.91 * x[1];
    else z = 2 * z - x[i - 2];
    let pp = 0;
    for (let it = 0; it < 100; it++) {
      let p1 = pim4;
      let p2 = 0;
      for (let j = 1; j <= n; j++) {
        const p3 = p2;
        p2 = p1;
        p1 = z * Math.sqrt(2 / j) * p2 - Math.sqrt((j - 1) / j) * p3;
      }
      pp = Math.sqrt(2 * n) * p2;
      const z1 = z;
      z = z1 - p1 / pp;
      if (Math.abs(z - z1) <= 1e-15 * Math.max(1, Math.abs(z))) break;
    }
    x[i] = z;
    x[n - 1 - i] = -z;
    w[i] = 2 / (pp * pp);
    w[n - 1 - i] = w[i];
  }
  if (n % 2 === 1) x[m - 1] = 0;
  const order = Array.from({ length: n }, (_, k) => k).sort((a, b) => x[a] - x[b]);
  const rule = { nodes: Float64Array.from(order, (k) => x[k]), weights: Float64Array.from(order, (k) => w[k]) };
  cache.set(n, rule);
  return rule;
}
