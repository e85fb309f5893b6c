/**
 * Normal-approximation power of the Wald test for a log-linear Poisson
 * trend with fixed site effects (common practice: the large-sample power of
 * a Wald test, e.g. Lehmann & Romano, Testing Statistical Hypotheses, 3rd
 * ed., 2005, ch. 13). The slope's variance is the inverse of its expected
 * Fisher information after the site effects are profiled out:
 *   I_b = sum_i sum_t v m_i (1+r)^t (t - tbar)^2,  tbar = sum_t (1+r)^t t / sum_t (1+r)^t,
 * with E[m_i] = m exp(siteSd^2 / 2) averaged over the site effects, and
 *   power = Phi(|b|/se - z_{1-alpha/2}) + Phi(-|b|/se - z_{1-alpha/2}).
 */
import { normalQuantile, normalUpper } from '../engine/math/distributions';
import type { PowerDesign } from './power-design';

export function poissonTrendPower(d: PowerDesign): { power: number; se: number } {
  const q = 1 + d.annualChange;
  let s0 = 0;
  let s1 = 0;
  for (let t = 0; t < d.seasons; t++) {
    s0 += Math.pow(q, t);
    s1 += Math.pow(q, t) * t;
  }
  const tbar = s1 / s0;
  let ss = 0;
  for (let t = 0; t < d.seasons; t++) ss += Math.pow(q, t) * (t - tbar) ** 2;
  const info = d.sites * d.visits * d.meanCount * Math.exp((d.siteSd * d.siteSd) / 2) * ss;
  const se = 1 / Math.sqrt(info);
  const b = Math.abs(Math.log(q));
  const z = normalQuantile(1 - d.alpha / 2);
  return { power: normalUpper(z - b / se) + normalUpper(z + b / se), se };
}
