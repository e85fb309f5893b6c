/**
 * The fitted distribution of each used row of a fit, as the shared
 * probability-mass functions take it (../engine/zero/pmf.ts). Every
 * probability-based diagnostic goes through here.
 *
 * A quasi-Poisson fit has no distribution of its own; its probabilities are
 * those of the Poisson with the same means (common practice for frequency
 * plots and residuals), and `note` says so.
 */
import type { FitOutcome } from '../engine/types';
import type { CountDistribution, PmfParameters } from '../engine/zero/pmf';
import { cumulativeProbability, probabilityMass } from '../engine/zero/pmf';
import { hasZeroPart } from '../model/spec';

/** The parts of a fit that the diagnostics read. */
export type FitForDiagnostics = Pick<FitOutcome, 'distribution' | 'rows' | 'y' | 'mu' | 'theta' | 'zeroProb' | 'expected'>;

export interface FittedDistribution {
  readonly distribution: CountDistribution;
  /** Number of used rows. */
  readonly n: number;
  /** The parameters of used row i. */
  parameters(i: number): PmfParameters;
  /** P(Y_i = k). */
  mass(i: number, k: number): number;
  /** P(Y_i <= k); 0 for k < 0. */
  cdf(i: number, k: number): number;
  /** A sentence when the probabilities are a stand-in (quasi-Poisson), else null. */
  readonly note: string | null;
}

export class DiagnosticsInputError extends Error {
  constructor(readonly code: string, message: string) {
    super(message);
    this.name = 'DiagnosticsInputError';
  }
}

export const QUASI_POISSON_NOTE = 'A quasi-Poisson fit has no distribution of its own; its probabilities are taken from the Poisson with the same fitted means.';

export function fittedDistribution(fit: FitForDiagnostics): FittedDistribution {
  const distribution: CountDistribution = fit.distribution === 'quasipoisson' ? 'poisson' : fit.distribution;
  const n = fit.y.length;
  if (fit.mu.length !== n) throw new DiagnosticsInputError('bad-fit', `The fit has ${n} responses but ${fit.mu.length} fitted means; refit the model.`);
  const zero = hasZeroPart(distribution) ? fit.zeroProb : undefined;
  if (hasZeroPart(distribution) && (!zero || zero.length !== n)) {
    throw new DiagnosticsInputError('bad-fit', `The ${distribution} fit carries no zero-part probabilities, so its diagnostics cannot be computed; refit the model.`);
  }
  const theta = fit.theta;
  // A negative binomial on its boundary (no overdispersion) has theta null: it is the Poisson fit.
  const asPoisson = theta === null && (distribution === 'negbin' || distribution === 'zinb' || distribution === 'hurdle-negbin');
  const used: CountDistribution = asPoisson ? ({ negbin: 'poisson', zinb: 'zip', 'hurdle-negbin': 'hurdle-poisson' } as const)[distribution as 'negbin' | 'zinb' | 'hurdle-negbin'] : distribution;
  const parameters = (i: number): PmfParameters => ({ mu: fit.mu[i], theta, zeroProb: zero ? zero[i] : undefined });
  return {
    distribution: used,
    n,
    parameters,
    mass: (i, k) => probabilityMass(used, k, parameters(i)),
    cdf: (i, k) => (k < 0 ? 0 : cumulativeProbability(used, k, parameters(i))),
    note: fit.distribution === 'quasipoisson' ? QUASI_POISSON_NOTE : null,
  };
}
