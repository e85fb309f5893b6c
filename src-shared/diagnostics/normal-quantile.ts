/**
 * The standard normal quantile with full relative accuracy in the tails.
 * The jstat inverse the engine uses (engine/math/distributions.ts) drifts
 * below p = 1e-10 (it gives -9.147 for p = 1e-20, where the value is
 * -9.262), which matters for the residual of an extreme count; so its
 * value is polished by Newton steps on log Q(-z) = log p, with Q the upper
 * tail of ../engine/math/distributions.ts, accurate far out.
 */
import { normalQuantile, normalUpper } from '../engine/math/distributions';

const LOG_SQRT_2PI = 0.5 * Math.log(2 * Math.PI);

/** Phi^-1(p) for 0 < p < 1; -Infinity / Infinity at 0 / 1. */
export function normalQuantileAccurate(p: number): number {
  if (!(p > 0)) return p === 0 ? Number.NEGATIVE_INFINITY : Number.NaN;
  if (!(p < 1)) return p === 1 ? Number.POSITIVE_INFINITY : Number.NaN;
  if (p > 0.5) return -normalQuantileAccurate(1 - p);
  let z = normalQuantile(p);
  if (p > 1e-8) return z;
  const target = Math.log(p);
  for (let k = 0; k < 8; k++) {
    const logQ = Math.log(normalUpper(-z));
    // d/dz log Q(-z) = phi(z) / Q(-z)
    const slope = Math.exp(-0.5 * z * z - LOG_SQRT_2PI - logQ);
    const step = (logQ - target) / slope;
    z -= step;
    if (Math.abs(step) < 1e-14 * Math.abs(z)) break;
  }
  return z;
}
