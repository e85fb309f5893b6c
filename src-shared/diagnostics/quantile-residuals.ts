/**
 * Randomized quantile residuals (Dunn, P.K. & Smyth, G.K. 1996, "Randomized
 * quantile residuals", J. Computational and Graphical Statistics 5(3):
 * 236-244): for a count y with fitted CDF F, u is drawn uniformly between
 * F(y - 1) and F(y) and the residual is r = Phi^-1(u). Under the true model
 * the residuals are exactly standard normal, whatever the distribution, so
 * one normal QQ plot and one scale serve every model. The uniforms come from
 * a seeded generator, so a plot is redrawn identically.
 */
import { createRng } from '../demo/prng';
import { normalQuantileAccurate as normalQuantile } from './normal-quantile';
import type { FitForDiagnostics, FittedDistribution } from './fitted-distribution';
import { DiagnosticsInputError, fittedDistribution } from './fitted-distribution';
import { FAR_UPPER, upperTailSum } from './tail-probability';

/** u is kept this far inside (0, 1) on the lower side, so r >= about -8.2 and never infinite. */
const U_EDGE = 1e-16;

export interface QuantileResiduals {
  /** Table row of each residual. */
  readonly rows: Int32Array;
  readonly y: Float64Array;
  /** Fitted value E[y] of each row. */
  readonly fitted: Float64Array;
  readonly residual: Float64Array;
  /** F(y - 1) and F(y): the interval u was drawn from. */
  readonly lower: Float64Array;
  readonly upper: Float64Array;
  readonly seed: number;
  readonly note: string | null;
}

export interface ResidualOptions {
  /** Seed of the uniforms (default 1). */
  readonly seed?: number;
  /**
   * Uniforms on (0, 1) to use instead of the generator, one per used row
   * (u = F(y - 1) + v (F(y) - F(y - 1))); for comparisons with other software.
   */
  readonly uniforms?: ArrayLike<number>;
}


/**
 * The residual of a count y given its fitted distribution and a uniform v:
 * u = F(y - 1) + v P(Y = y), r = Phi^-1(u). Far in the upper tail the same u
 * is formed from the upper tail, 1 - u = P(Y > y) + (1 - v) P(Y = y), and
 * r = -Phi^-1(1 - u), so a large count keeps an accurate, finite residual.
 */
export function quantileResidualOf(dist: FittedDistribution, i: number, y: number, v: number): { residual: number; lower: number; upper: number } {
  const lower = dist.cdf(i, y - 1);
  const upper = Math.max(lower, dist.cdf(i, y));
  if (lower > FAR_UPPER) {
    const atLeast = upperTailSum(dist, i, y);
    const at = dist.mass(i, y);
    const rest = Math.min(1 - U_EDGE, Math.max(Number.MIN_VALUE, atLeast - at + (1 - v) * at));
    return { residual: -normalQuantile(rest), lower, upper };
  }
  const u = Math.min(1 - U_EDGE, Math.max(U_EDGE, lower + v * (upper - lower)));
  return { residual: normalQuantile(u), lower, upper };
}

/** Residuals of responses y (default the observed ones) under a fitted distribution. */
export function residualsFor(dist: FittedDistribution, y: ArrayLike<number>, uniform: () => number, out?: { residual: Float64Array; lower?: Float64Array; upper?: Float64Array }): Float64Array {
  const residual = out?.residual ?? new Float64Array(dist.n);
  for (let i = 0; i < dist.n; i++) {
    const r = quantileResidualOf(dist, i, y[i], uniform());
    residual[i] = r.residual;
    if (out?.lower) out.lower[i] = r.lower;
    if (out?.upper) out.upper[i] = r.upper;
  }
  return residual;
}

export function quantileResiduals(fit: FitForDiagnostics, options: ResidualOptions = {}): QuantileResiduals {
  const dist = fittedDistribution(fit);
  const seed = options.seed ?? 1;
  const n = dist.n;
  let uniform: () => number;
  if (options.uniforms) {
    const v = options.uniforms;
    if (v.length !== n) throw new DiagnosticsInputError('bad-uniforms', `Give one uniform per used row: the fit has ${n} rows but ${v.length} uniforms were given.`);
    let k = 0;
    uniform = () => v[k++];
  } else {
    const rng = createRng(seed);
    uniform = () => rng.uniform();
  }
  const lower = new Float64Array(n);
  const upper = new Float64Array(n);
  const residual = residualsFor(dist, fit.y, uniform, { residual: new Float64Array(n), lower, upper });
  return { rows: fit.rows, y: fit.y, fitted: fit.expected, residual, lower, upper, seed, note: dist.note };
}
