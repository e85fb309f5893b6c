/**
 * Plain-sentence warnings about a finished zero-inflated or hurdle fit:
 * non-convergence (saying what was tried), theta at its limit, a zero part
 * with no extra zeros, and estimates on a boundary (huge standard errors,
 * as with separation in the zero part).
 */
import type { Warning } from '../types';
import type { ZeroCoreFit } from './fit-core';
import { LOG_THETA_LIMIT } from './fit-core';
import type { ZeroModelData } from './likelihood';
import { inverseNegativeHessian } from './newton-maximize';
import type { CheckedKind } from './input-checks';

/** Largest |gradient| in SE units, for the non-convergence message. */
function gradientPhrase(fit: ZeroCoreFit): string {
  const k = fit.par.length;
  // A fit without inference has no covariance: inverted here (only a fit that did not converge needs it).
  const cov = fit.covariance ?? inverseNegativeHessian(fit.hessian, k);
  if (!cov) return 'the information matrix was not positive definite at the last step';
  let m = 0;
  for (let j = 0; j < k; j++) m = Math.max(m, Math.abs(fit.gradient[j]) * Math.sqrt(cov[j * k + j]));
  return `the largest gradient component was ${m.toPrecision(2)} standard errors`;
}

export function fitWarnings(kind: CheckedKind & { count: 'poisson' | 'negbin' }, fit: ZeroCoreFit): Warning[] {
  const out: Warning[] = [];
  if (!fit.converged) {
    out.push({
      code: 'not-converged',
      message: `The ${kind.label} fit did not converge: ${fit.reason} after ${fit.iterations} Newton steps (ridge-damped where needed, started from Poisson and logistic fits); ${gradientPhrase(fit)}. Estimates are from the last step; simplify the model or check for sparse factor levels.`,
    });
  }
  if (fit.thetaAtLimit) {
    out.push({
      code: 'boundary-theta',
      message: `Theta reached its upper limit (${Math.exp(LOG_THETA_LIMIT).toPrecision(2)}): the count part shows no overdispersion, so the ${kind.zero === 'hurdle' ? 'hurdle-poisson' : 'zip'} model fits as well. Standard errors treat theta as fixed.`,
    });
  }
  if (kind.zero === 'zero-inflated') {
    let largest = 0;
    for (let i = 0; i < fit.zeroProb.length; i++) largest = Math.max(largest, fit.zeroProb[i]);
    if (largest < 1e-6) {
      out.push({
        code: 'other',
        message: `The estimated probability of an extra zero is below ${largest.toPrecision(2)} in every row: the data show no zeros beyond those of the count distribution. Consider the ${kind.count} model.`,
      });
    }
  }
  return out;
}

/**
 * Coefficients whose standard error times the spread of their column exceeds
 * 100 on the linear-predictor scale: their estimates run off to a boundary
 * (separation, a level with only zeros, a part the data do not need).
 */
export function largeErrorWarnings(m: ZeroModelData, par: Float64Array, cov: Float64Array): Warning[] {
  const kc = m.X.p + m.Z.p;
  const names: string[] = [];
  [m.X, m.Z].forEach((D, part) => {
    const from = part === 0 ? 0 : m.X.p;
    for (let j = 0; j < D.p; j++) {
      let lo = Infinity;
      let hi = -Infinity;
      for (let i = 0; i < D.n; i++) {
        const v = D.data[j * D.n + i];
        if (v < lo) lo = v;
        if (v > hi) hi = v;
      }
      const spread = hi > lo ? hi - lo : Math.max(Math.abs(hi), 1);
      const se = Math.sqrt(cov[(from + j) * kc + from + j]);
      if (se * spread > 100 || !Number.isFinite(par[from + j])) names.push(`${part === 0 ? 'count' : 'zero'} part "${D.names[j]}"`);
    }
  });
  if (names.length === 0) return [];
  return [
    {
      code: 'other',
      message: `Very large standard errors for ${names.join(', ')}: these estimates run off towards a boundary (for example a predictor that separates zeros from non-zeros, or a part the data do not need). Treat them as unreliable; simplify that part of the model.`,
    },
  ];
}
