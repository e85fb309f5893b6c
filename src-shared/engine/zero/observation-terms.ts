/**
 * One observation's log-likelihood under a zero-inflated or hurdle model,
 * with first and second derivatives in the three linear predictors:
 *   a = log(mu)          count part (offsets included)
 *   b = logit(zero part) ZI: probability of an extra zero; hurdle: probability of a non-zero count
 *   t = log(theta)       negative-binomial size (absent for Poisson)
 *
 * Zero-inflated, y = 0: log(pi + (1 - pi) f(0)) as a log-sum-exp of
 * log(pi) and log(1 - pi) + log f(0); the derivatives use the mixture rule
 *   l_xy = r A_xy + w B_xy + r w (A_x - B_x)(A_y - B_y)
 * with r, w the posterior weights of the two components.
 * Hurdle, y > 0: log(p) + log f(y) - log(1 - f(0)).
 */
import type { CountKind, CountTerms } from './count-density';
import { countTerms, newCountTerms } from './count-density';

export type ZeroKind = 'zero-inflated' | 'hurdle';

export interface ObservationTerms {
  ll: number;
  la: number;
  lb: number;
  lt: number;
  laa: number;
  lab: number;
  lat: number;
  lbb: number;
  lbt: number;
  ltt: number;
}

/** Scratch space for observationTerms (one per loop, reused). */
export interface ObservationScratch {
  readonly out: ObservationTerms;
  readonly atY: CountTerms;
  readonly atZero: CountTerms;
}

export function newObservationScratch(): ObservationScratch {
  return {
    out: { ll: 0, la: 0, lb: 0, lt: 0, laa: 0, lab: 0, lat: 0, lbb: 0, lbt: 0, ltt: 0 },
    atY: newCountTerms(),
    atZero: newCountTerms(),
  };
}

/** log(1 / (1 + exp(-x))) without overflow. */
export function logSigmoid(x: number): number {
  return x >= 0 ? -Math.log1p(Math.exp(-x)) : x - Math.log1p(Math.exp(x));
}

/** 1 / (1 + exp(-x)) without overflow. */
export function sigmoid(x: number): number {
  if (x >= 0) return 1 / (1 + Math.exp(-x));
  const e = Math.exp(x);
  return e / (1 + e);
}

/** log(1 - exp(h)) for h < 0, accurate near 0 and far below it. */
export function log1mExp(h: number): number {
  return h > -Math.LN2 ? Math.log(-Math.expm1(h)) : Math.log1p(-Math.exp(h));
}

/** log(exp(u) + exp(v)). */
export function logSumExp(u: number, v: number): number {
  const m = Math.max(u, v);
  if (m === -Infinity) return -Infinity;
  return m + Math.log1p(Math.exp(-Math.abs(u - v)));
}

function fillCountOnly(o: ObservationTerms, base: number, c: CountTerms): void {
  o.ll = base + c.g;
  o.la = c.ga;
  o.lt = c.gt;
  o.laa = c.gaa;
  o.lat = c.gat;
  o.ltt = c.gtt;
  o.lab = 0;
  o.lbt = 0;
}

/** Fills scratch.out for count y at a = log(mu), b, theta (ignored for Poisson). */
export function observationTerms(
  zero: ZeroKind,
  count: CountKind,
  y: number,
  a: number,
  b: number,
  theta: number,
  scratch: ObservationScratch,
): ObservationTerms {
  const o = scratch.out;
  const mu = Math.exp(a);
  const pr = sigmoid(b);
  if (zero === 'zero-inflated') {
    if (y > 0) {
      fillCountOnly(o, logSigmoid(-b), countTerms(count, y, mu, theta, scratch.atY));
      o.lb = -pr;
      o.lbb = -pr * (1 - pr);
      return o;
    }
    const h = countTerms(count, 0, mu, theta, scratch.atZero);
    const logExtra = logSigmoid(b);
    const logCount = logSigmoid(-b) + h.g;
    const ll = logSumExp(logExtra, logCount);
    const r = Math.exp(logExtra - ll);
    const w = Math.exp(logCount - ll);
    const rw = r * w;
    o.ll = ll;
    o.la = w * h.ga;
    o.lt = w * h.gt;
    o.lb = r * (1 - pr) - w * pr;
    o.laa = w * h.gaa + rw * h.ga * h.ga;
    o.lat = w * h.gat + rw * h.ga * h.gt;
    o.ltt = w * h.gtt + rw * h.gt * h.gt;
    o.lab = -rw * h.ga;
    o.lbt = -rw * h.gt;
    o.lbb = -pr * (1 - pr) + rw;
    return o;
  }
  // hurdle: pr is the probability of a non-zero count
  o.lbb = -pr * (1 - pr);
  if (y === 0) {
    o.ll = logSigmoid(-b);
    o.lb = -pr;
    o.la = o.lt = o.laa = o.lat = o.ltt = o.lab = o.lbt = 0;
    return o;
  }
  const c = countTerms(count, y, mu, theta, scratch.atY);
  const h = countTerms(count, 0, mu, theta, scratch.atZero);
  // d/dx [-log(1 - e^h)] = s h_x with s = e^h / (1 - e^h); ds/dh = s (1 + s)
  const s = 1 / Math.expm1(-h.g);
  const s2 = s * (1 + s);
  o.ll = logSigmoid(b) + c.g - log1mExp(h.g);
  o.lb = 1 - pr;
  o.la = c.ga + s * h.ga;
  o.lt = c.gt + s * h.gt;
  o.laa = c.gaa + s * h.gaa + s2 * h.ga * h.ga;
  o.lat = c.gat + s * h.gat + s2 * h.ga * h.gt;
  o.ltt = c.gtt + s * h.gtt + s2 * h.gt * h.gt;
  o.lab = 0;
  o.lbt = 0;
  return o;
}
