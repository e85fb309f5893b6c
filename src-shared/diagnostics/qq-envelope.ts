/**
 * Normal QQ plot of randomized quantile residuals with a simulation
 * envelope: responses are simulated from the fitted model (seeded), their
 * residuals computed under the same fitted distribution and sorted, and the
 * pointwise 2.5% and 97.5% of the sorted residuals bound each plotted point.
 *
 * Simplification: the model is NOT refitted to each simulated data set; the
 * envelope shows the spread of residuals under the fitted parameters, which
 * is a little wider than with refits (estimation pulls residuals toward
 * normal) and so errs on the side of flagging less. Pointwise bands: about
 * 5% of the points of a well-fitting model fall outside them by chance.
 */
import { createRng, deriveSeed } from '../demo/prng';
import { normalQuantile } from '../engine/math/distributions';
import type { DiagnosticsControl } from './cancellable';
import { checkCancelled, reportProgress } from './cancellable';
import type { FitForDiagnostics } from './fitted-distribution';
import { DiagnosticsInputError, fittedDistribution } from './fitted-distribution';
import type { QuantileResiduals } from './quantile-residuals';
import { residualsFor } from './quantile-residuals';
import { simulateResponses } from './simulate-responses';

export interface QqPoint {
  /** Normal quantile at plotting position (j - 0.5) / n. */
  readonly theoretical: number;
  readonly residual: number;
  readonly lower: number;
  readonly upper: number;
  /** Table row of the residual. */
  readonly row: number;
  readonly outside: boolean;
}

export interface QqEnvelope {
  readonly points: QqPoint[];
  readonly simulations: number;
  readonly level: number;
  /** Share of points outside their band. */
  readonly outsideShare: number;
  readonly method: string;
}

export interface QqOptions {
  /** Simulated data sets (default 99). */
  readonly simulations?: number;
  /** Seed of the simulations (default the residuals' seed). */
  readonly seed?: number;
  readonly control?: DiagnosticsControl;
}

export const QQ_METHOD = 'Pointwise 95% envelope from responses simulated under the fitted parameters (the model is not refitted to each simulated set).';

/** The p-quantile of a sorted array by linear interpolation (type 7). */
function sortedQuantile(sorted: Float64Array, p: number): number {
  const h = (sorted.length - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(sorted.length - 1, lo + 1);
  return sorted[lo] + (h - lo) * (sorted[hi] - sorted[lo]);
}

export function qqEnvelope(fit: FitForDiagnostics, residuals: QuantileResiduals, options: QqOptions = {}): QqEnvelope {
  const simulations = options.simulations ?? 99;
  if (!(Number.isInteger(simulations) && simulations >= 19)) {
    throw new DiagnosticsInputError('bad-simulations', `The QQ envelope needs at least 19 simulated data sets (got ${simulations}); 99 is usual.`);
  }
  const dist = fittedDistribution(fit);
  const n = dist.n;
  const seed = options.seed ?? residuals.seed;
  const rng = createRng(deriveSeed(seed, 'qq-envelope'));
  const uniform = () => rng.uniform();
  // sims[j * simulations + s]: the j-th smallest residual of simulation s.
  const sims = new Float64Array(n * simulations);
  const r = new Float64Array(n);
  for (let s = 0; s < simulations; s++) {
    checkCancelled(options.control);
    const ySim = simulateResponses(dist, rng);
    residualsFor(dist, ySim, uniform, { residual: r });
    r.sort();
    for (let j = 0; j < n; j++) sims[j * simulations + s] = r[j];
    if (s % 10 === 9) reportProgress(options.control, (s + 1) / simulations, 'QQ envelope');
  }
  const order = Array.from(residuals.residual.keys()).sort((a, b) => residuals.residual[a] - residuals.residual[b]);
  let outside = 0;
  const points = order.map((i, j) => {
    const column = sims.subarray(j * simulations, (j + 1) * simulations).sort();
    const lower = sortedQuantile(column, 0.025);
    const upper = sortedQuantile(column, 0.975);
    const residual = residuals.residual[i];
    const out = residual < lower || residual > upper;
    if (out) outside++;
    return { theoretical: normalQuantile((j + 0.5) / n), residual, lower, upper, row: residuals.rows[i], outside: out };
  });
  reportProgress(options.control, 1, 'QQ envelope');
  return { points, simulations, level: 0.95, outsideShare: outside / n, method: QQ_METHOD };
}
