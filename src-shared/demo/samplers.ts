import type { Rng } from './prng';

/**
 * Random variates from a seeded generator: normal, gamma, Poisson and
 * negative binomial (as a Poisson-gamma mixture). Each draw uses only the
 * generator it is given, so a run is reproduced exactly from its seed.
 */

/** Normal(mean, sd) by the Box-Muller transform (one value per two uniforms). */
export function sampleNormal(rng: Rng, mean = 0, sd = 1): number {
  const u1 = rng.uniform();
  const u2 = rng.uniform();
  return mean + sd * Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
}

/**
 * Gamma(shape, scale): mean shape*scale, variance shape*scale^2.
 * Marsaglia and Tsang's squeeze method (2000); shape < 1 by the boost
 * Gamma(shape+1) * U^(1/shape).
 */
export function sampleGamma(rng: Rng, shape: number, scale = 1): number {
  if (!(shape > 0) || !(scale > 0)) throw new RangeError(`sampleGamma needs shape > 0 and scale > 0 (got ${shape}, ${scale}).`);
  if (shape < 1) return sampleGamma(rng, shape + 1, scale) * Math.pow(rng.uniform(), 1 / shape);
  const d = shape - 1 / 3;
  const c = 1 / Math.sqrt(9 * d);
  for (;;) {
    const x = sampleNormal(rng);
    const t = 1 + c * x;
    if (t <= 0) continue;
    const v = t * t * t;
    const u = rng.uniform();
    if (u < 1 - 0.0331 * x * x * x * x) return d * v * scale;
    if (Math.log(u) < 0.5 * x * x + d * (1 - v + Math.log(v))) return d * v * scale;
  }
}

/** log(k!) exactly for small k, by Stirling's series above. */
export function logFactorial(k: number): number {
  if (k < LOG_FACTORIALS.length) return LOG_FACTORIALS[k];
  const n = k + 1;
  // log Gamma(n), Stirling series to 1/n^5: error far below 1e-12 for n > 20.
  return (n - 0.5) * Math.log(n) - n + 0.5 * Math.log(2 * Math.PI) + 1 / (12 * n) - 1 / (360 * n * n * n) + 1 / (1260 * n ** 5);
}

const LOG_FACTORIALS: number[] = (() => {
  const out = [0];
  for (let k = 1; k <= 20; k++) out.push(out[k - 1] + Math.log(k));
  return out;
})();

/**
 * Poisson(mean). Small means by multiplying uniforms (Knuth); from 10 up by
 * Hoermann's transformed rejection with squeeze, PTRS (1993).
 */
export function samplePoisson(rng: Rng, mean: number): number {
  if (!(mean >= 0) || !Number.isFinite(mean)) throw new RangeError(`samplePoisson needs a finite mean >= 0 (got ${mean}).`);
  if (mean === 0) return 0;
  if (mean < 10) {
    const limit = Math.exp(-mean);
    let k = 0;
    let p = rng.uniform();
    while (p > limit) {
      k++;
      p *= rng.uniform();
    }
    return k;
  }
  const slam = Math.sqrt(mean);
  const loglam = Math.log(mean);
  const b = 0.931 + 2.53 * slam;
  const a = -0.059 + 0.02483 * b;
  const invAlpha = 1.1239 + 1.1328 / (b - 3.4);
  const vr = 0.9277 - 3.6224 / (b - 2);
  for (;;) {
    const u = rng.uniform() - 0.5;
    const v = rng.uniform();
    const us = 0.5 - Math.abs(u);
    const k = Math.floor(((2 * a) / us + b) * u + mean + 0.43);
    if (us >= 0.07 && v <= vr) return k;
    if (k < 0 || (us < 0.013 && v > us)) continue;
    if (Math.log(v) + Math.log(invAlpha) - Math.log(a / (us * us) + b) <= -mean + k * loglam - logFactorial(k)) return k;
  }
}

/**
 * Negative binomial with mean `mean` and size `theta`
 * (variance mean + mean^2/theta): Poisson with a gamma(theta, mean/theta) mean.
 */
export function sampleNegBinomial(rng: Rng, mean: number, theta: number): number {
  if (!(theta > 0)) throw new RangeError(`sampleNegBinomial needs theta > 0 (got ${theta}).`);
  if (mean === 0) return 0;
  return samplePoisson(rng, sampleGamma(rng, theta, mean / theta));
}
