/**
 * The total log-likelihood of a zero-inflated or hurdle model with its
 * analytic gradient and Hessian in the parameter vector
 *   [beta (count part, X columns), gamma (zero part, Z columns), log(theta) (negative binomial only)].
 *
 * Per-observation derivatives in the linear predictors come from
 * ./observation-terms.ts and are mapped through the design matrices.
 */
import type { Design } from '../types';
import type { CountKind } from './count-density';
import type { ZeroKind } from './observation-terms';
import { newObservationScratch, observationTerms } from './observation-terms';
import { crossprodVec, matVec, weightedCrossprod } from '../linalg/dense';
import { addCrossBlock, placeBlock, total } from './design-products';

export interface ZeroModelData {
  readonly zero: ZeroKind;
  readonly count: CountKind;
  readonly y: Float64Array;
  /** Count-part design. */
  readonly X: Design;
  /** Zero-part design. */
  readonly Z: Design;
  /** Count-part offset (already on the log scale). */
  readonly offset: Float64Array;
}

export interface Evaluation {
  value: number;
  grad: Float64Array | null;
  /** k x k, column-major, symmetric. */
  hess: Float64Array | null;
}

export function parameterCount(m: ZeroModelData): number {
  return m.X.p + m.Z.p + (m.count === 'negbin' ? 1 : 0);
}

/** Per-observation log-likelihoods and derivatives in the linear predictors (a, b, t). */
interface ObservationArrays {
  value: number;
  la: Float64Array | null;
  lb: Float64Array | null;
  lt: Float64Array | null;
  laa: Float64Array | null;
  lab: Float64Array | null;
  lbb: Float64Array | null;
  lat: Float64Array | null;
  lbt: Float64Array | null;
  ltt: Float64Array | null;
}

function observationArrays(m: ZeroModelData, par: Float64Array, order: 0 | 1 | 2, perObservation?: Float64Array): ObservationArrays {
  const { X, Z, y } = m;
  const n = y.length;
  const px = X.p;
  const pz = Z.p;
  const nb = m.count === 'negbin';
  const theta = nb ? Math.exp(par[px + pz]) : Number.POSITIVE_INFINITY;
  const a = matVec(X.data, n, px, par.subarray(0, px), m.offset);
  const b = matVec(Z.data, n, pz, par.subarray(px, px + pz), null);
  const scratch = newObservationScratch();
  const arr = (want: boolean) => (want ? new Float64Array(n) : null);
  const o1 = order >= 1;
  const o2 = order >= 2;
  const r: ObservationArrays = {
    value: 0,
    la: arr(o1),
    lb: arr(o1),
    lt: arr(o1 && nb),
    laa: arr(o2),
    lab: arr(o2),
    lbb: arr(o2),
    lat: arr(o2 && nb),
    lbt: arr(o2 && nb),
    ltt: arr(o2 && nb),
  };
  let value = 0;
  for (let i = 0; i < n; i++) {
    const o = observationTerms(m.zero, m.count, y[i], a[i], b[i], theta, scratch);
    value += o.ll;
    if (perObservation) perObservation[i] = o.ll;
    if (r.la) r.la[i] = o.la;
    if (r.lb) r.lb[i] = o.lb;
    if (r.lt) r.lt[i] = o.lt;
    if (r.laa) r.laa[i] = o.laa;
    if (r.lab) r.lab[i] = o.lab;
    if (r.lbb) r.lbb[i] = o.lbb;
    if (r.lat) r.lat[i] = o.lat;
    if (r.lbt) r.lbt[i] = o.lbt;
    if (r.ltt) r.ltt[i] = o.ltt;
  }
  r.value = value;
  return r;
}

/**
 * Log-likelihood at `par`; order 1 adds the gradient, order 2 the Hessian.
 * `perObservation`, when given, receives each observation's log-likelihood.
 * A value that is not finite comes back as -Infinity (the optimiser's cue to shorten a step).
 */
export function evaluateZeroModel(m: ZeroModelData, par: Float64Array, order: 0 | 1 | 2, perObservation?: Float64Array): Evaluation {
  const { X, Z } = m;
  const n = m.y.length;
  const px = X.p;
  const pz = Z.p;
  const k = parameterCount(m);
  const o = observationArrays(m, par, order, perObservation);
  if (!Number.isFinite(o.value)) return { value: Number.NEGATIVE_INFINITY, grad: null, hess: null };
  let grad: Float64Array | null = null;
  if (o.la && o.lb) {
    grad = new Float64Array(k);
    grad.set(crossprodVec(X.data, n, px, o.la), 0);
    grad.set(crossprodVec(Z.data, n, pz, o.lb), px);
    if (o.lt) grad[px + pz] = total(o.lt);
  }
  let hess: Float64Array | null = null;
  if (o.laa && o.lab && o.lbb) {
    hess = new Float64Array(k * k);
    placeBlock(weightedCrossprod(X.data, n, px, o.laa), px, hess, k, 0);
    placeBlock(weightedCrossprod(Z.data, n, pz, o.lbb), pz, hess, k, px);
    addCrossBlock(X, Z, o.lab, hess, k, 0, px);
    if (o.lat && o.lbt && o.ltt) {
      const t = px + pz;
      const xt = crossprodVec(X.data, n, px, o.lat);
      const zt = crossprodVec(Z.data, n, pz, o.lbt);
      for (let j = 0; j < px; j++) hess[t * k + j] = hess[j * k + t] = xt[j];
      for (let j = 0; j < pz; j++) hess[t * k + px + j] = hess[(px + j) * k + t] = zt[j];
      hess[t * k + t] = total(o.ltt);
    }
  }
  return { value: o.value, grad, hess };
}

/**
 * Each observation's score vector (gradient of its log-likelihood) as the
 * rows of an n x k column-major matrix, for sandwich covariances.
 * `withTheta` false leaves out the log(theta) column.
 */
export function scoreMatrix(m: ZeroModelData, par: Float64Array, withTheta = true): Float64Array {
  const { X, Z } = m;
  const n = m.y.length;
  const o = observationArrays(m, par, 1);
  const cols = X.p + Z.p + (withTheta && o.lt ? 1 : 0);
  const s = new Float64Array(n * cols);
  for (let j = 0; j < X.p; j++) for (let i = 0; i < n; i++) s[j * n + i] = X.data[j * n + i] * o.la![i];
  for (let j = 0; j < Z.p; j++) for (let i = 0; i < n; i++) s[(X.p + j) * n + i] = Z.data[j * n + i] * o.lb![i];
  if (withTheta && o.lt) s.set(o.lt, (X.p + Z.p) * n);
  return s;
}
