/** Seeded random numbers for simulation tests (invented data only). */

/** mulberry32: a small seeded uniform generator on [0, 1). */
export function rng(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

export function normal(u: () => number): number {
  return Math.sqrt(-2 * Math.log(1 - u())) * Math.cos(2 * Math.PI * u());
}

/** Poisson draw by inversion (fine for the moderate means used here). */
export function poisson(u: () => number, mu: number): number {
  if (mu > 60) return Math.max(0, Math.round(mu + Math.sqrt(mu) * normal(u)));
  let k = 0;
  let p = Math.exp(-mu);
  let c = p;
  const x = u();
  while (x > c && k < 1000) {
    k++;
    p *= mu / k;
    c += p;
  }
  return k;
}

/** Gamma(shape, scale) by Marsaglia & Tsang (2000). */
export function gamma(u: () => number, shape: number, scale: number): number {
  if (shape < 1) return gamma(u, shape + 1, scale) * Math.pow(u(), 1 / shape);
  const d = shape - 1 / 3;
  const c = 1 / Math.sqrt(9 * d);
  for (;;) {
    let x: number;
    let v: number;
    do {
      x = normal(u);
      v = 1 + c * x;
    } while (v <= 0);
    v = v * v * v;
    const w = u();
    if (w < 1 - 0.0331 * x ** 4 || Math.log(w) < 0.5 * x * x + d * (1 - v + Math.log(v))) return d * v * scale;
  }
}

/** NB2 draw: Poisson with a gamma(theta, mu/theta) mean. */
export function negbin(u: () => number, mu: number, theta: number): number {
  return poisson(u, gamma(u, theta, mu / theta));
}
