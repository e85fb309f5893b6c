/**
 * Site-clustered sandwich covariance of a zero-inflated or hurdle fit, with
 * the shared cluster sandwich (../inference/sandwich.ts): the bread is the
 * inverse observed information, the meat sums each site's score vectors
 * over every parameter (log(theta) included unless theta is held at its
 * limit). Each row of the score matrix is passed as a "design" row with
 * score factor 1, so the shared code's small-sample factor
 * G/(G-1) (n-1)/(n-k) counts all k parameters.
 */
import { clusterIndex, clusterSandwich } from '../inference/sandwich';
import type { ZeroCoreFit } from './fit-core';
import type { ZeroModelData } from './likelihood';
import { scoreMatrix } from './likelihood';
import { inverseNegativeHessian } from './newton-maximize';

function block(m: Float64Array, k: number, size: number): Float64Array {
  const out = new Float64Array(size * size);
  for (let j = 0; j < size; j++) for (let i = 0; i < size; i++) out[j * size + i] = m[j * k + i];
  return out;
}

/** Clustered covariance of [beta, gamma] (kc x kc), or null when the information is singular. */
export function siteClusteredCovariance(m: ZeroModelData, fit: ZeroCoreFit, siteLabels: readonly string[]): { cov: Float64Array; clusters: number } | null {
  const k = fit.par.length;
  const kc = m.X.p + m.Z.p;
  const withTheta = m.count === 'negbin' && !fit.thetaAtLimit;
  const size = withTheta ? k : kc;
  const bread = withTheta ? fit.covariance : inverseNegativeHessian(block(fit.hessian, k, kc), kc);
  if (!bread) return null;
  const n = m.y.length;
  const cl = clusterIndex(siteLabels);
  const v = clusterSandwich({
    x: scoreMatrix(m, fit.par, withTheta),
    n,
    p: size,
    score: new Float64Array(n).fill(1),
    bread,
    cluster: cl.index,
    clusters: cl.levels.length,
  });
  return { cov: block(v, size, kc), clusters: cl.levels.length };
}
