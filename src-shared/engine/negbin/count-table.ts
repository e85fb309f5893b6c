/**
 * The response summarised by distinct count, for the sums over
 * observations that depend on the count only through Gamma-function terms:
 *
 *   sum_i w_i (psi(t + y_i) - psi(t)),  sum_i w_i (psi'(t) - psi'(t + y_i)),
 *   sum_i w_i (log Gamma(y_i + t) - log Gamma(t)).
 *
 * Counts take few distinct values, so each term is computed once per value
 * (weighted by how often it occurs) instead of once per observation. For
 * small counts the terms are the exact finite sums over k < y of 1/(t + k),
 * 1/(t + k)^2 and log(t + k), accumulated from one value to the next; from
 * SMALL_COUNT on, digamma, trigamma and lgamma differences, as the
 * per-observation formulas do.
 */
import digamma from '@stdlib/math-base-special-digamma';
import trigamma from '@stdlib/math-base-special-trigamma';
import { lgamma, logFactorial } from '../math/lgamma';

/** From this count on the Gamma-function differences are used instead of the finite sums. */
export const SMALL_COUNT = 64;

/** Largest count tallied in a dense array; larger ones are grouped with a map. */
const DENSE_LIMIT = 1 << 20;

export interface CountTable {
  /** The distinct responses, increasing. */
  readonly values: Float64Array;
  /** Sum of the prior weights (number of observations when unweighted) at each value. */
  readonly weight: Float64Array;
}

/** Groups the responses (non-negative numbers, in practice counts) by value. */
export function countTable(y: Float64Array, w: Float64Array | null = null): CountTable {
  let max = 0;
  let integral = true;
  for (let i = 0; i < y.length; i++) {
    const v = y[i];
    if (v > max) max = v;
    if (!Number.isInteger(v) || v < 0) integral = false;
  }
  if (integral && max <= DENSE_LIMIT) {
    const tally = new Float64Array(max + 1);
    const seen = new Uint8Array(max + 1);
    for (let i = 0; i < y.length; i++) {
      tally[y[i]] += w ? w[i] : 1;
      seen[y[i]] = 1;
    }
    let k = 0;
    for (let v = 0; v <= max; v++) k += seen[v];
    const values = new Float64Array(k);
    const weight = new Float64Array(k);
    for (let v = 0, q = 0; v <= max; v++) {
      if (!seen[v]) continue;
      values[q] = v;
      weight[q++] = tally[v];
    }
    return { values, weight };
  }
  const byValue = new Map<number, number>();
  for (let i = 0; i < y.length; i++) byValue.set(y[i], (byValue.get(y[i]) ?? 0) + (w ? w[i] : 1));
  const values = Float64Array.from(byValue.keys()).sort();
  return { values, weight: Float64Array.from(values, (v) => byValue.get(v)!) };
}

/**
 * sum over the distinct values v (weighted) of f(v), where f(v) is the
 * finite sum of term(k) over k < v for v < SMALL_COUNT (accumulated from one
 * value to the next) and large(v) from there on.
 */
function perValueSum(table: CountTable, term: (k: number) => number, large: (v: number) => number): number {
  const { values, weight } = table;
  let s = 0;
  let k = 0;
  let run = 0;
  for (let q = 0; q < values.length; q++) {
    const v = values[q];
    if (v < SMALL_COUNT) {
      for (; k < v; k++) run += term(k);
      s += weight[q] * run;
    } else {
      s += weight[q] * large(v);
    }
  }
  return s;
}

/**
 * sum_i w_i (psi(t + y_i) - psi(t)) and sum_i w_i (psi'(t) - psi'(t + y_i)):
 * the count terms of the score and the information of theta.
 */
export function digammaSums(table: CountTable, t: number): { psi: number; tri: number } {
  return {
    psi: perValueSum(table, (k) => 1 / (t + k), (v) => digamma(t + v) - digamma(t)),
    tri: perValueSum(
      table,
      (k) => {
        const r = 1 / (t + k);
        return r * r;
      },
      (v) => trigamma(t) - trigamma(t + v),
    ),
  };
}

/** sum_i w_i (log Gamma(y_i + t) - log Gamma(t)). */
export function lgammaRatioSum(table: CountTable, t: number): number {
  return perValueSum(table, (k) => Math.log(t + k), (v) => lgamma(v + t) - lgamma(t));
}

/** sum_i w_i log(y_i!). */
export function logFactorialSum(table: CountTable): number {
  let s = 0;
  for (let q = 0; q < table.values.length; q++) s += table.weight[q] * logFactorial(table.values[q]);
  return s;
}
