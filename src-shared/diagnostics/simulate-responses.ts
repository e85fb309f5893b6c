/**
 * Responses drawn from a fitted model, one per used row, with a seeded
 * generator: the count part by the demo samplers (Poisson; negative binomial
 * as a Poisson-gamma mixture), the zero part by one more uniform. The
 * positive part of a hurdle model is drawn by inversion of its CDF.
 */
import type { Rng } from '../demo/prng';
import { sampleNegBinomial, samplePoisson } from '../demo/samplers';
import type { FittedDistribution } from './fitted-distribution';

/** Smallest k with P(Y <= k) >= u, walking the mass function (for the hurdle's positive part). */
function invertCdf(dist: FittedDistribution, i: number, u: number): number {
  let k = 0;
  let acc = dist.mass(i, 0);
  while (acc < u && k < 1e7) {
    k++;
    const p = dist.mass(i, k);
    acc += p;
    if (p === 0 && k > dist.parameters(i).mu) break;
  }
  return k;
}

function countDraw(rng: Rng, mu: number, theta: number | null | undefined, negbin: boolean): number {
  return negbin ? sampleNegBinomial(rng, mu, theta as number) : samplePoisson(rng, mu);
}

/** One simulated response per used row of the fitted distribution. */
export function simulateResponses(dist: FittedDistribution, rng: Rng): Float64Array {
  const d = dist.distribution;
  const negbin = d === 'negbin' || d === 'zinb' || d === 'hurdle-negbin';
  const out = new Float64Array(dist.n);
  for (let i = 0; i < dist.n; i++) {
    const p = dist.parameters(i);
    if (d === 'poisson' || d === 'negbin') out[i] = countDraw(rng, p.mu, p.theta, negbin);
    else if (d === 'zip' || d === 'zinb') out[i] = rng.uniform() < (p.zeroProb as number) ? 0 : countDraw(rng, p.mu, p.theta, negbin);
    else {
      const nonZero = p.zeroProb as number;
      const u = rng.uniform();
      // Hurdle: zero with probability 1 - p; otherwise a draw from the upper part of the CDF.
      out[i] = u < 1 - nonZero ? 0 : invertCdf(dist, i, u);
    }
  }
  return out;
}
